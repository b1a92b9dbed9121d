// The numbers behind the plots of one channel, as plain JSON: the transfer curve (sensed voltage and
// ADC code against temperature, straight from the sweep) and the error bands per calibration mode
// (straight from the budget). Shared by the CLI (`plot`) and the language server (`thermoscribe/plotData`).
// No drawing here: spec.ts turns this into chart specs.
import type { ChannelResult } from '../analysis/types';
import type { ChannelDef } from '../model/types';
import type { BudgetResult, CalMode } from '../analysis/budget-types';
import { describeSetting } from '../budget/describe';
import { ZERO_CELSIUS_K } from '../physics/constants';
import { channelDynamics, filterWords, rampLagAt, stepRemainder } from '../analysis/dynamics';
import { trimNumber } from '../diagnostics/numbers';
import type { Analysis } from '../analysis/result';
import type { Diagnostic } from '../diagnostics/diagnostic';
import { LineIndex } from '../syntax/line-index';
import { escapeControls } from '../diagnostics/shown';
import { OUTLIER_RULE, residualRows, type ResidualRow } from '../calibration/fit';
import { kindOf } from '../sensors/registry';
import { kindCautions } from '../report/caution';

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

/** The channel's response to a step and a ramp of the medium (analysis/dynamics.ts), slowest sensor. */
export interface DynamicsSeries {
  /** What was assumed, in words: the time constant, the sample period and the filter. */
  label: string;
  step: {
    /** Time after the step, s. */
    t: number[];
    /** The sensor (first order, continuous) and the filtered reading at the sample instants, K above the old temperature. */
    sensor: number[];
    reading: number[];
    stepK: number;
    /** Settle to within this of the new temperature, K (the accuracy); null when none is stated. */
    epsK: number | null;
    /** When the reading stays within it, s, and the target, s (null when not stated). */
    settleS: number | null;
    targetS: number | null;
  };
  /** Null when no ramp is stated. */
  ramp: {
    t: number[];
    /** Lag behind the medium, K: the sensor, and the filtered reading at the sample instants. */
    sensorLag: number[];
    readingLag: number[];
    rampKPerMin: number;
    /** Steady-state lag of the reading and the target, K. */
    lagK: number;
    targetK: number;
  } | null;
}

/** The measured points' residuals against the fitted model (calibration/fit.ts), with the outlier rule's limits. */
export interface ResidualSeries {
  /** The fitted model in words: the kind, the sensor, the constants, and what the budget and the generated code use. */
  model: string;
  /** The outlier rule, stated as in `report` and the hover. */
  rule: string;
  /** One per measured point, in the order of `measured` (spec points, then the bench data's rows). */
  points: ResidualRow[];
  rmsK: number;
}

export interface PlotData {
  channel: string;
  transfer: TransferSeries;
  /** Null when the budget could not be computed (the diagnostics say why). */
  error: ErrorSeries | null;
  /** Null when the channel states no time constant (or lacks what its figures need). */
  dynamics?: DynamicsSeries | null;
  /** Present when the channel has measured points that its kind fits (`measured`, `bench_data`). */
  residuals?: ResidualSeries;
  /** Safety lines of the channel's sensor kind (sensors/kind.ts `cautions`), shown under the plots with the general caution. */
  cautions: string[];
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
  const dynamics = dynamicsSeries(result);
  const residuals = residualSeries(c, notes);
  return {
    channel: c.name, transfer, error: budget ? errorSeries(budget, notes) : null,
    ...(dynamics ? { dynamics } : {}), ...(residuals ? { residuals } : {}),
    cautions: kindCautions([c]), notes,
  };
}

/** The measured points' residuals and the model they were fitted to; null without points its kind fits. */
export function residualSeries(c: ChannelDef, notes: string[] = []): ResidualSeries | null {
  const res = residualRows(c);
  if (!res) return null;
  const { fit, rows } = res;
  // A point whose residual is not finite (a fit that failed there) is left out of the chart, said in the notes.
  const points = rows.map((r) => ({ ...r, source: escapeControls(r.source) })).filter((r) => Number.isFinite(r.celsius) && Number.isFinite(r.residualK) && Number.isFinite(r.toleranceK) && (r.leaveOneOutK === null || Number.isFinite(r.leaveOneOutK)));
  if (points.length < rows.length) notes.push(`${rows.length - points.length} measured points without a finite residual are left out of the residual chart.`);
  const constants = (p: Record<string, number>) => Object.entries(p).map(([k, v]) => `${k} = ${trimNumber(v, 5)}`).join(', ');
  const out = fit.outlier !== null ? rows[fit.outlier] : undefined;
  const kind = kindOf(c.sensor);
  const model = `${kind.name} model of '${c.sensor.name}' fitted to all ${rows.length} point${rows.length === 1 ? '' : 's'}: ${constants(fit.parameters)}` +
    (out ? `; the budget and the generated code use it fitted without the outlier (${out.source}): ${constants(fit.usedParameters)}` : '; the budget and the generated code use this fit');
  return { model, rule: OUTLIER_RULE, points, rmsK: fit.rmsK };
}

/** Points drawn per curve, at most. */
const CURVE_POINTS = 240;

/** The step and ramp responses of the chosen filter behind the slowest sensor; null without the figures. */
export function dynamicsSeries(result: ChannelResult): DynamicsSeries | null {
  const d = channelDynamics(result);
  if (!d || d.missing.length > 0 || !d.spec.timeConstant) return null;
  const tau = d.tauWorstS;
  const T = d.samplePeriodS;
  const f = d.chosen.filter;
  const target = d.spec.settling?.seconds ?? null;
  // Long enough to show the settling and five time constants, and the filter's own length.
  const tEnd = Math.max(5 * tau, 1.2 * (d.chosen.settleS ?? 0), 1.2 * (target ?? 0), T === null ? 0 : 40 * T);
  // Sample instants when a period is given (every k-th one), else an even grid.
  const times: number[] = [];
  const samples: number[] = [];
  if (T === null) for (let i = 0; i <= CURVE_POINTS; i++) times.push((tEnd * i) / CURVE_POINTS);
  else {
    const nEnd = Math.ceil(tEnd / T);
    const stride = Math.max(1, Math.ceil(nEnd / CURVE_POINTS));
    for (let n = 0; n <= nEnd; n += stride) (samples.push(n), times.push(n * T));
  }
  const sensorAt = (t: number) => d.stepK * -Math.expm1(-t / tau);
  const step = {
    t: times,
    sensor: times.map(sensorAt),
    reading: T === null ? times.map(sensorAt) : samples.map((n) => d.stepK * (1 - stepRemainder(f, tau, T, n))),
    stepK: d.stepK,
    epsK: d.epsK,
    settleS: d.chosen.settleS,
    targetS: target,
  };
  const r = d.spec.rampLag;
  const ramp = r
    ? {
        t: times,
        sensorLag: times.map((t) => r.rampKPerS * tau * -Math.expm1(-t / tau)),
        readingLag: T === null ? times.map((t) => r.rampKPerS * tau * -Math.expm1(-t / tau)) : samples.map((n) => r.rampKPerS * rampLagAt(f, tau, T, n)),
        rampKPerMin: r.rampKPerS * 60,
        lagK: d.chosen.lagK ?? r.rampKPerS * tau,
        targetK: r.lagK,
      }
    : null;
  const label = `sensor time constant ${trimNumber(tau, 3)} s (slowest)${T === null ? ', read continuously' : `, sampled every ${trimNumber(T, 3)} s`}; filter: ${filterWords(f)}`;
  return { label, step, ramp };
}

/** The charts `plot --chart` and the panel draw; `both`: every chart the channel's data has. */
export const CHART_KINDS = ['both', 'transfer', 'error', 'dynamics', 'residuals'] as const;
export type ChartKind = (typeof CHART_KINDS)[number];

/** Beyond this magnitude a figure is not drawn (chart scales and labels stay readable and finite). */
const DRAWABLE = 1e12;

/**
 * Why the data cannot be drawn as asked (fewer than two finite points, or a figure too large for a
 * chart), in the spec's words; null when it can. Checked before drawing, so nothing half-drawn is written.
 */
export function plotProblem(d: PlotData, chart: ChartKind): string | null {
  const ok = (a: number[]) => a.every((x) => Number.isFinite(x) && Math.abs(x) <= DRAWABLE);
  const t = d.transfer;
  if (chart === 'residuals' || (chart === 'both' && d.residuals && d.residuals.points.length > 0)) {
    const r = d.residuals;
    if (!r) return `channel '${d.channel}' has no measured points that its sensor's model is fitted to (measured, bench_data): there are no residuals to draw`;
    if (r.points.length === 0) return `channel '${d.channel}': no measured point has a finite residual to draw; check the measured points against the range and the bias`;
    const p = r.points;
    if (!ok(p.map((x) => x.celsius)) || !ok(p.map((x) => x.residualK)) || !ok(p.map((x) => x.toleranceK)) || !ok(p.flatMap((x) => (x.leaveOneOutK === null ? [] : [x.leaveOneOutK])))) return `channel '${d.channel}': a residual leaves the drawable range (±${DRAWABLE} K); check the measured points`;
    if (chart === 'residuals') return null;
  }
  if (chart === 'dynamics' || (chart === 'both' && d.dynamics)) {
    const y = d.dynamics;
    if (!y) return `channel '${d.channel}' states no time_constant (or its dynamics lack a field, see the problems list): there is no response to draw`;
    if (!ok(y.step.t) || !ok(y.step.sensor) || !ok(y.step.reading) || (y.ramp && (!ok(y.ramp.readingLag) || !ok(y.ramp.sensorLag)))) return `channel '${d.channel}': the response leaves the drawable range; check time_constant, sample_period and the step`;
    if (chart === 'dynamics') return null;
  }
  if (chart === 'both' || chart === 'transfer') {
    if (t.celsius.length < 2) return `channel '${d.channel}' has fewer than two sweep points with a finite voltage to draw`;
    if (!ok(t.volts) || !ok(t.celsius)) return `channel '${d.channel}': the sensed voltage leaves the drawable range (±${DRAWABLE} V); check the bias and gain`;
  }
  if (chart === 'both' || chart === 'error') {
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
