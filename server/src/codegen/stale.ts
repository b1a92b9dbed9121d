// Generated blocks whose spec hash no longer matches their channel: the spec changed after the code
// was generated. Pure: the caller hands over the C text (the server reads it through its document
// host, the CLI from the disk).
import type { ChannelResult } from '../analysis/types';
import { DiagnosticSink, type Diagnostic } from '../checks/diagnostic';
import { channelSpecHash, conversionFilePath, generatableResults } from './channel-input';
import { scanGeneratedBlocks } from './markers';
import type { FoundBlock } from './types';

export interface StaleBlock {
  block: FoundBlock;
  /** The channel's result in the analysis the block was compared with. */
  result: ChannelResult;
  /** Hash the block would carry if generated now. */
  currentHash: string;
}

/**
 * Blocks of `cText` for a channel of the analysis whose hash differs from the channel's current one.
 * Blocks of channels the analysis does not have (renamed, removed, or with errors) are left alone:
 * there is nothing to compare them with.
 */
export function staleBlocks(cText: string, analysis: { channels: readonly ChannelResult[] }): StaleBlock[] {
  const byName = new Map(generatableResults(analysis.channels).map((r) => [r.channel.name, r]));
  const out: StaleBlock[] = [];
  for (const block of scanGeneratedBlocks(cText).blocks) {
    const result = byName.get(block.channel);
    if (!result) continue;
    const currentHash = channelSpecHash(result.channel);
    if (currentHash !== block.hash) out.push({ block, result, currentHash });
  }
  return out;
}

/**
 * `generated-stale` diagnostics on the name of each channel whose block in the spec's
 * `<stem>_conversion.c` is out of date; `read` gives a file's text (or undefined when absent).
 */
export function staleDiagnostics(analysis: { path: string; channels: readonly ChannelResult[] }, read: (absPath: string) => string | undefined): Diagnostic[] {
  const cPath = conversionFilePath(analysis.path);
  const text = read(cPath);
  if (text === undefined) return [];
  const sink = new DiagnosticSink();
  const file = cPath.split(/[\\/]/).pop() ?? cPath;
  for (const s of staleBlocks(text, analysis)) {
    const c = s.result.channel;
    sink.report('generated-stale', c.file, c.nameSpan, `the generated code for '${c.name}' in ${file} was made from an earlier version of this channel (spec ${s.block.hash}, now ${s.currentHash}); regenerate it`, { channel: c.name });
  }
  return sink.items;
}
