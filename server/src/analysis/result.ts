// What one analysis of a spec gives: its files, the resolved model, each channel's results and
// every diagnostic. Made by the engine's façade (engine.ts), read by the language features and products.
import type { Diagnostic } from '../diagnostics/diagnostic';
import type { LoadedFile } from '../model/workspace';
import type { Resolution } from '../model/block-reader';
import type { ChannelResult } from './types';

export interface Analysis {
  path: string;
  /** The entry file first, then every file it uses. */
  files: LoadedFile[];
  model: Resolution;
  channels: ChannelResult[];
  /** Every diagnostic, of the entry file and of used files (see `file`). */
  diagnostics: Diagnostic[];
  /** Channels whose worst-case budget an analysis with a budget allowance left to compute (`errorBudget` in engine.ts); their budget checks wait. */
  budgetsPending: ChannelResult[];
  /** Data files the spec names besides the files it uses (each channel's `bench_data`), read or not: a change of one on disk calls for a new analysis. */
  dataFiles: string[];
}
