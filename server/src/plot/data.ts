// The numbers behind the plots of one channel, as plain JSON: the transfer curve (sensed voltage and
// ADC code against temperature, straight from the sweep) and the error bands per calibration mode
// (straight from the budget). Shared by the CLI (`plot`) and the language server (`thermoscribe/plotData`).
// No drawing here: spec.ts turns this into chart specs.
import type { ChannelResult } from '../analysis/types';
import type { BudgetResult, CalMode } from '../analysis/budget-types';
import { describeSetting } from '../budget/describe';
import { ZERO_CELSIUS_K } from '../physics/constants';
import type { Analysis } from '../analysis/result';
import type { Diagnostic } from '../diagnostics/diagnostic';
import { LineIndex } from '../syntax/line-index';

export interface TransferSeries {
  celsius: number[];
  /** Voltage at the ADC input, V (sweep point `volts`). */
  volts: number[];
  /** Ideal ADC code (sweep point `code`). */
  code: number[];
  bits: number;
  referenceVolts: number;
}

export interface ModeBand {
  mode: CalMode;
  /** Words for the mode, e.g. "two-point calibration at 0 °C and 40 °C". */
  label: string;
  /** True for the calibration the spec states. */
  stated: boolean;
  /** Calibration temperatures, °C. */
  calibrationCelsius: number[];
  worstLow: number[];
  worstHigh: number[];
  /** Monte Carlo percentiles per temperature, K; null when Monte Carlo did not run. */
  mc: { p1: number[]; p5: number[]; p50: number[]; p95: number[]; p99: number[] } | null;
  worstAbsK: number;
  mcP99AbsK: number | null;
}

export interface ErrorSeries {
  /** Temperatures of the budget grid, °C. */
  celsius: number[];
  /** Accuracy target, K (drawn as ± lines); null when the spec states none. */
  targetK: number | null;
  modes: ModeBand[];
  /** Monte Carlo runs behind the percentiles (0 when none). */
  runs: number;
  seed: number | null;
}

export interface PlotData {
  channel: string;
  transfer: TransferSeries;
  /** Null when the budget could not be computed (the diagnostics say why). */
  error: ErrorSeries | null;
  notes: string[];
}

/** Plot data from an analysed channel and its budget (pass `result.budget` or a budget run with other options). */
export function plotData(result: ChannelResult, budget: BudgetResult | null | undefined): PlotData {
  const c = result.channel;
  const notes: string[] = [];
  const pts = result.sweep.filter((p) => Number.isFinite(p.celsius) && Number.isFinite(p.volts) && Number.isFinite(p.code));
  if (pts.length < result.sweep.length) notes.push(`${result.sweep.length - pts.length} sweep points without a finite value are left out.`);
  const transfer: TransferSeries = {
    celsius: pts.map((p) => p.celsius),
    volts: pts.map((p) => p.volts),
    code: pts.map((p) => p.code),
    bits: c.adc.bits,
    referenceVolts: c.adc.reference.value,
  };
  return { channel: c.name, transfer, error: budget ? errorSeries(budget, notes) : null, notes };
}

/** Beyond this magnitude a figure is not drawn (chart scales and labels stay readable and finite). */
const DRAWABLE = 1e12;

/**
 * Why the data cannot be drawn as asked (fewer than two finite points, or a figure too large for a
 * chart), in the spec's words; null when it can. Checked before drawing, so nothing half-drawn is written.
 */
export function plotProblem(d: PlotData, chart: 'both' | 'transfer' | 'error'): string | null {
  const ok = (a: number[]) => a.every((x) => Number.isFinite(x) && Math.abs(x) <= DRAWABLE);
  const t = d.transfer;
  if (chart !== 'error') {
    if (t.celsius.length < 2) return `channel '${d.channel}' has fewer than two sweep points with a finite voltage to draw`;
    if (!ok(t.volts) || !ok(t.celsius)) return `channel '${d.channel}': the sensed voltage leaves the drawable range (±${DRAWABLE} V); check the bias and gain`;
  }
  if (chart !== 'transfer') {
    const e = d.error;
    if (!e || e.celsius.length < 2) return `channel '${d.channel}': the error budget has fewer than two temperatures with a finite error to draw`;
    for (const m of e.modes) {
      if (!ok(m.worstLow) || !ok(m.worstHigh)) return `channel '${d.channel}': the error (${m.label}) leaves the drawable range (±${DRAWABLE} K); check the reference, bits and bias`;
    }
  }
  return null;
}

function errorSeries(b: BudgetResult, notes: string[]): ErrorSeries {
  // Keep only temperatures where every series is finite, so that no chart gets a NaN.
  const keep: number[] = [];
  for (let i = 0; i < b.celsius.length; i++) {
    const values = [b.celsius[i]!, ...b.modes.flatMap((m) => [m.worstLow[i]!, m.worstHigh[i]!, ...(m.mc ? [m.mc.p1[i]!, m.mc.p5[i]!, m.mc.p50[i]!, m.mc.p95[i]!, m.mc.p99[i]!] : [])])];
    if (values.every(Number.isFinite)) keep.push(i);
  }
  if (keep.length < b.celsius.length) notes.push(`${b.celsius.length - keep.length} budget temperatures without a finite error are left out.`);
  const pick = (a: number[]) => keep.map((i) => a[i]!);
  return {
    celsius: pick(b.celsius),
    targetK: b.accuracyK !== null && Number.isFinite(b.accuracyK) ? b.accuracyK : null,
    modes: b.modes.map((m) => ({
      mode: m.setting.mode,
      label: describeSetting(m.setting),
      stated: m === b.stated,
      calibrationCelsius: m.setting.kelvins.map((k) => k - ZERO_CELSIUS_K),
      worstLow: pick(m.worstLow),
      worstHigh: pick(m.worstHigh),
      mc: m.mc ? { p1: pick(m.mc.p1), p5: pick(m.mc.p5), p50: pick(m.mc.p50), p95: pick(m.mc.p95), p99: pick(m.mc.p99) } : null,
      worstAbsK: m.worstAbsK,
      mcP99AbsK: m.mcP99AbsK,
    })),
    runs: b.monteCarlo?.runs ?? 0,
    seed: b.monteCarlo?.seed ?? null,
  };
}

/**
 * Why a channel written in the entry file cannot be analysed or plotted, in words: its errors (those inside its
 * block first, else every error of the spec, which may sit in a block it uses), each with its line.
 * Null when the file has no channel block of that name, or nothing of error severity stops it.
 */
export function plotBlockers(a: Analysis, channel: string): string | null {
  const file = a.files[0];
  const block = file?.parse.tree.items.find((i) => i.kind === 'block' && i.keyword.text === 'channel' && i.name.text === channel);
  if (!file || !block || block.kind !== 'block') return null;
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  const inside = errors.filter((d) => d.file === a.path && d.span.start >= block.span.start && d.span.end <= block.span.end);
  const shown = (inside.length ? inside : errors).slice(0, 3);
  if (shown.length === 0) return null;
  const where = (d: Diagnostic) => {
    const f = a.files.find((x) => x.path === d.file);
    const line = f ? new LineIndex(f.text).position(d.span.start).line + 1 : null;
    const name = d.file === a.path ? '' : `${d.file.split(/[\\/]/).pop()} `;
    return line === null ? '' : `${name}line ${line}: `;
  };
  const more = (inside.length ? inside : errors).length - shown.length;
  return `channel '${channel}' has no figures or plots until ${shown.length > 1 ? 'these errors are' : 'this error is'} fixed: ` +
    shown.map((d) => `${where(d)}${d.message} [${d.code}]`).join('; ') + (more > 0 ? `; and ${more} more in the problems list` : '');
}
