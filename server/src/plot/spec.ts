// Chart specs (Vega 6 JSON, vega.github.io/vega/docs) for a channel's plot data: the transfer curve
// (sensed voltage and ADC code against temperature, two panels) and the error against temperature
// (one panel per calibration mode: worst-case band, Monte Carlo 1-99 % and 5-95 % bands, median,
// ± accuracy target). The one spec builder shared by the CLI's SVG and the editor panel.
// Plain JSON with fixed numbers: no expressions, no data loading, so it renders offline under a
// strict content security policy (with vega-interpreter) as well as in Node.
import { trimNumber } from '../diagnostics/numbers';
import type { CalMode } from '../analysis/budget-types';
import type { ChartKind, DynamicsSeries, ErrorSeries, ModeBand, PlotData, ResidualSeries } from './data';
import { NEUTRAL_THEME, type PlotTheme } from './theme';

/** `both`: every chart the data has (transfer, error; the response when the channel states its dynamics; the residuals when it has measured points). */
export type { ChartKind };
export type VegaSpec = Record<string, unknown>;

/** Series labels as they appear in the charts (tests look for them). */
export const LABELS = {
  volts: 'sensed voltage',
  code: 'ADC code',
  worst: 'worst case',
  mcOuter: 'Monte Carlo 1–99 %',
  mcInner: 'Monte Carlo 5–95 %',
  median: 'Monte Carlo median',
  target: 'accuracy target',
  calibration: 'calibration point',
  sensor: 'sensor alone',
  reading: 'filtered reading',
  settleBand: 'within the accuracy',
  lagTarget: 'ramp_lag target',
  residual: 'residual (fit to all points)',
  othersFit: "others' fit (point left out)",
  outlierLimit: 'outlier limit (± tolerance)',
  outlier: 'outlier (left out of the fit used)',
} as const;

// Two lines: Vega measures text without a canvas in Node by a rough estimate, and one long line widens the SVG.
const CAUTION = ['Model figures, not a safety assessment: verify the built channel', 'against a calibrated reference thermometer; local codes and the applicable standards govern.'];
const MODE_ORDER: CalMode[] = ['none', 'one-point', 'two-point'];

export interface SpecOptions {
  chart?: ChartKind;
  theme?: PlotTheme;
  /** Plot width in pixels (axes and labels add to it). */
  width?: number;
}

const W_DEFAULT = 560;
const H_TRANSFER = 150;
const H_ERROR = 150;
const GAP = 64;
const TITLE_GAP = 22;
/** Room above a panel for its own title. */
const PANEL_TITLE = 22;
const LEGEND_ROW = 16;

const r6 = (x: number) => Number(x.toPrecision(6));
const k3 = (x: number) => trimNumber(x, 3);

/** The chart spec of a channel's plot data. */
export function plotSpec(data: PlotData, o: SpecOptions = {}): VegaSpec {
  const theme = o.theme ?? NEUTRAL_THEME;
  const W = Math.max(240, Math.min(2000, Math.round(o.width ?? W_DEFAULT)));
  const chart = o.chart ?? 'both';
  const datasets: VegaSpec[] = [];
  const marks: VegaSpec[] = [];
  let y = 0;
  // Headings wrap at the plot's width, so a narrow panel gets a narrow chart rather than one
  // scaled down as a whole (tiny labels).
  const heading = (text: string, sub?: string) => {
    const head = wrap(text, W, theme.fontSize + 3);
    const lines = sub ? wrap(sub, W, theme.fontSize) : [];
    const headH = head.length * (theme.fontSize + 5);
    marks.push(textMark(head, 0, y, theme, { fontSize: theme.fontSize + 3, fontWeight: 'bold', name: `heading-${marks.length}` }));
    if (sub) marks.push(textMark(lines, 0, y + headH + 1, theme, { fill: theme.muted, name: `subheading-${marks.length}` }));
    y += TITLE_GAP + (headH - (theme.fontSize + 5)) + lines.length * (theme.fontSize + 2) + PANEL_TITLE - (sub ? 2 : 0);
  };

  if (chart === 'both' || chart === 'transfer') {
    const t = data.transfer;
    heading(`Channel ${data.channel}: transfer curve`, `${t.bits}-bit ADC on a ${k3(t.referenceVolts)} V reference`);
    datasets.push({ name: 'transfer', values: t.celsius.map((c, i) => ({ t: r6(c), v: r6(t.volts[i]!), code: t.code[i]! })) });
    const xDomain = extent(t.celsius);
    marks.push(panel('transfer-volts', y, W, H_TRANSFER, `${capital(LABELS.volts)} at the ADC input`, xDomain, pad(extent(t.volts)), 'sensed voltage, V', theme, [
      lineMark('volts', 'transfer', 't', 'v', theme.volts, 2),
    ]));
    y += H_TRANSFER + GAP;
    marks.push(panel('transfer-code', y, W, H_TRANSFER, `${LABELS.code} (ideal converter)`, xDomain, pad(extent(t.code)), 'ADC code', theme, [
      lineMark('code', 'transfer', 't', 'code', theme.code, 2, 'step-after'),
    ]));
    y += H_TRANSFER + GAP;
  }

  if (chart === 'error' || chart === 'both') {
    const e = data.error;
    if (!e || e.celsius.length === 0) {
      heading(`Channel ${data.channel}: error budget`);
      marks.push(textMark('No error budget: the channel has problems that stop it (see the problems list).', 0, y, theme, { name: 'no-budget' }));
      y += 30;
    } else {
      heading(`Channel ${data.channel}: error against temperature (reported minus true)`,
        `${e.runs > 0 ? `Monte Carlo ${e.runs} boards (seed ${e.seed ?? '-'})` : 'no Monte Carlo'}${e.targetK !== null ? `; accuracy target ±${k3(e.targetK)} K` : '; no accuracy target stated'}`);
      const key = legend(y - PANEL_TITLE, W, e, theme);
      marks.push(key.mark);
      y += 24 + (key.rows - 1) * LEGEND_ROW;
      const modes = [...e.modes].sort((a, b) => MODE_ORDER.indexOf(a.mode) - MODE_ORDER.indexOf(b.mode));
      for (const m of modes) {
        datasets.push({ name: `err-${m.mode}`, values: e.celsius.map((c, i) => errorRow(c, i, m)) });
        marks.push(errorPanel(m, e, y, W, theme));
        y += H_ERROR + GAP;
      }
    }
  }
  if ((chart === 'both' || chart === 'dynamics') && data.dynamics) {
    const d = data.dynamics;
    heading(`Channel ${data.channel}: response to the medium`, d.label);
    const key = legendOf(y - PANEL_TITLE, W, [
      { label: LABELS.sensor, kind: 'line', colour: theme.volts },
      { label: LABELS.reading, kind: 'line', colour: theme.code },
      ...(d.step.epsK !== null ? [{ label: LABELS.settleBand, kind: 'line' as const, colour: theme.target, dash: [6, 4] }] : []),
      ...(d.ramp ? [{ label: LABELS.lagTarget, kind: 'line' as const, colour: theme.worst, dash: [6, 4] }] : []),
    ], theme, 'legend-dynamics');
    marks.push(key.mark);
    y += 24 + (key.rows - 1) * LEGEND_ROW;
    for (const p of dynamicsPanels(d, y, W, theme, datasets)) {
      marks.push(p);
      y += H_ERROR + GAP;
    }
  } else if (chart === 'dynamics') {
    heading(`Channel ${data.channel}: response to the medium`);
    marks.push(textMark('No response figures: the channel states no time_constant, or its dynamics lack a field (see the problems list).', 0, y, theme, { name: 'no-dynamics' }));
    y += 30 + GAP;
  }
  if ((chart === 'both' || chart === 'residuals') && data.residuals && data.residuals.points.length > 0) {
    const r = data.residuals;
    heading(`Channel ${data.channel}: residuals of the measured points`, `${capital(r.model)}; rms residual ${k3(r.rmsK)} K. Outliers: ${r.rule}.`);
    const key = legendOf(y - PANEL_TITLE, W, [
      { label: LABELS.residual, kind: 'symbol', colour: theme.volts, shape: 'circle', filled: true },
      { label: LABELS.othersFit, kind: 'symbol', colour: theme.code, shape: 'circle', filled: false },
      { label: LABELS.outlierLimit, kind: 'line', colour: theme.target, dash: [6, 4] },
      ...(r.points.some((p) => p.outlier) ? [{ label: LABELS.outlier, kind: 'symbol' as const, colour: theme.target, shape: 'cross', filled: true }] : []),
    ], theme, 'legend-residuals');
    marks.push(key.mark);
    y += 24 + (key.rows - 1) * LEGEND_ROW;
    marks.push(residualPanel(r, y, W, theme, datasets));
    y += H_ERROR + GAP;
  } else if (chart === 'residuals') {
    heading(`Channel ${data.channel}: residuals of the measured points`);
    marks.push(textMark('No residuals: the channel has no measured points that its sensor\'s model is fitted to (measured, bench_data).', 0, y, theme, { name: 'no-residuals' }));
    y += 30 + GAP;
  }
  // The general caution, then the sensor kind's own (a thermocouple's mains isolation, say).
  const caution = wrap(CAUTION.join(' '), W, theme.fontSize);
  const lines = [...(caution.length <= CAUTION.length ? CAUTION : caution), ...(data.cautions ?? []).flatMap((c) => wrap(c, W, theme.fontSize))];
  marks.push(textMark(lines, 0, y - GAP + 40, theme, { fill: theme.muted, fontStyle: 'italic', name: 'caution' }));
  y += 24 + Math.max(0, lines.length - CAUTION.length) * (theme.fontSize + 2);

  return {
    description: `Thermoscribe plots of channel ${data.channel}`,
    width: W,
    height: Math.max(60, y),
    padding: 12,
    autosize: 'pad',
    background: theme.background,
    config: {
      axis: {
        labelColor: theme.foreground, titleColor: theme.foreground, domainColor: theme.muted, tickColor: theme.muted,
        gridColor: theme.muted, gridOpacity: 0.35, labelFont: theme.font, titleFont: theme.font,
        labelFontSize: theme.fontSize, titleFontSize: theme.fontSize, titleFontWeight: 'normal',
      },
      title: { color: theme.foreground, font: theme.font, fontSize: theme.fontSize + 1, anchor: 'start', fontWeight: 'bold' },
      text: { fill: theme.foreground, font: theme.font, fontSize: theme.fontSize },
    },
    data: datasets,
    marks,
  };
}

function errorRow(c: number, i: number, m: ModeBand): Record<string, number> {
  const row: Record<string, number> = { t: r6(c), wlo: r6(m.worstLow[i]!), whi: r6(m.worstHigh[i]!) };
  if (m.mc) Object.assign(row, { p1: r6(m.mc.p1[i]!), p5: r6(m.mc.p5[i]!), p50: r6(m.mc.p50[i]!), p95: r6(m.mc.p95[i]!), p99: r6(m.mc.p99[i]!) });
  return row;
}

function errorPanel(m: ModeBand, e: ErrorSeries, y: number, W: number, theme: PlotTheme): VegaSpec {
  const data = `err-${m.mode}`;
  const lo = Math.min(0, ...m.worstLow, ...(m.mc?.p1 ?? []), ...(e.targetK !== null ? [-e.targetK] : []));
  const hi = Math.max(0, ...m.worstHigh, ...(m.mc?.p99 ?? []), ...(e.targetK !== null ? [e.targetK] : []));
  const xDomain = extent(e.celsius);
  const inner: VegaSpec[] = [
    areaMark(`worst-${m.mode}`, data, 'wlo', 'whi', theme.worst, theme.worstOpacity),
  ];
  if (m.mc) {
    inner.push(areaMark(`mc-outer-${m.mode}`, data, 'p1', 'p99', theme.mcOuter, theme.mcOuterOpacity));
    inner.push(areaMark(`mc-inner-${m.mode}`, data, 'p5', 'p95', theme.mcInner, theme.mcInnerOpacity));
    inner.push(lineMark(`median-${m.mode}`, data, 't', 'p50', theme.median, 1.5));
  }
  inner.push(lineMark(`worst-low-${m.mode}`, data, 't', 'wlo', theme.worst, 1, 'linear', [1, 0]));
  inner.push(lineMark(`worst-high-${m.mode}`, data, 't', 'whi', theme.worst, 1, 'linear', [1, 0]));
  if (e.targetK !== null) {
    for (const [sign, name] of [[1, 'target-high'], [-1, 'target-low']] as const) {
      inner.push({
        type: 'rule', name: `${name}-${m.mode}`,
        encode: { enter: { x: { value: 0 }, x2: { value: W }, y: { scale: 'y', value: r6(sign * e.targetK) }, stroke: { value: theme.target }, strokeWidth: { value: 1.5 }, strokeDash: { value: [6, 4] } } },
      });
    }
  }
  for (const [i, c] of m.calibrationCelsius.entries()) {
    if (c < xDomain[0] || c > xDomain[1]) continue;
    inner.push({
      type: 'rule', name: `calibration-${m.mode}-${i + 1}`,
      encode: { enter: { x: { scale: 'x', value: r6(c) }, y: { value: 0 }, y2: { value: H_ERROR }, stroke: { value: theme.calibration }, strokeDash: { value: [2, 3] } } },
    });
  }
  const title = `${capital(m.label)}${m.stated ? ' (stated)' : ''}: worst case ±${k3(m.worstAbsK)} K` +
    (m.mcP99AbsK !== null ? `; Monte Carlo 1–99 % within ±${k3(m.mcP99AbsK)} K` : '');
  return panel(`error-${m.mode}`, y, W, H_ERROR, title, xDomain, pad([lo, hi]), 'error, K', theme, inner);
}

/** The step-response panel and, when a ramp is stated, the ramp-lag panel (time on the x axis). */
function dynamicsPanels(d: DynamicsSeries, y: number, W: number, theme: PlotTheme, datasets: VegaSpec[]): VegaSpec[] {
  const out: VegaSpec[] = [];
  const s = d.step;
  datasets.push({ name: 'dyn-step', values: s.t.map((t, i) => ({ t: r6(t), s: r6(s.sensor[i]!), r: r6(s.reading[i]!) })) });
  const xDomain = extent(s.t);
  const hRule = (name: string, v: number, colour: string) => ({ type: 'rule', name, encode: { enter: { x: { value: 0 }, x2: { value: W }, y: { scale: 'y', value: r6(v) }, stroke: { value: colour }, strokeWidth: { value: 1.5 }, strokeDash: { value: [6, 4] } } } });
  const vRule = (name: string, t: number, colour: string) => ({ type: 'rule', name, encode: { enter: { x: { scale: 'x', value: r6(t) }, y: { value: 0 }, y2: { value: H_ERROR }, stroke: { value: colour }, strokeDash: { value: [2, 3] } } } });
  const inner: VegaSpec[] = [lineMark('step-sensor', 'dyn-step', 't', 's', theme.volts, 1.5), lineMark('step-reading', 'dyn-step', 't', 'r', theme.code, 2)];
  if (s.epsK !== null) inner.push(hRule('settle-low', s.stepK - s.epsK, theme.target), hRule('settle-high', s.stepK + s.epsK, theme.target));
  if (s.settleS !== null && s.settleS >= xDomain[0] && s.settleS <= xDomain[1]) inner.push(vRule('settled', s.settleS, theme.code));
  if (s.targetS !== null && s.targetS >= xDomain[0] && s.targetS <= xDomain[1]) inner.push(vRule('settling-target', s.targetS, theme.target));
  const settled = s.settleS !== null ? `; within ±${k3(s.epsK ?? 0)} K after ${k3(s.settleS)} s` + (s.targetS !== null ? ` (settling asks ${k3(s.targetS)} s)` : '') : '';
  out.push(panel('dynamics-step', y, W, H_ERROR, `Reading after a step of ${k3(s.stepK)} K${settled}`, xDomain, pad([0, s.stepK + (s.epsK ?? 0)]), 'rise, K', theme, inner, 'time after the step, s'));
  const r = d.ramp;
  if (r) {
    datasets.push({ name: 'dyn-ramp', values: r.t.map((t, i) => ({ t: r6(t), s: r6(r.sensorLag[i]!), r: r6(r.readingLag[i]!) })) });
    const ramp: VegaSpec[] = [lineMark('ramp-sensor', 'dyn-ramp', 't', 's', theme.volts, 1.5), lineMark('ramp-reading', 'dyn-ramp', 't', 'r', theme.code, 2), hRule('lag-target', r.targetK, theme.worst)];
    out.push(panel('dynamics-ramp', y + H_ERROR + GAP, W, H_ERROR, `Ramp of ${k3(r.rampKPerMin)} K/min: the reading lags ${k3(r.lagK)} K in steady state (ramp_lag allows ${k3(r.targetK)} K)`, extent(r.t), pad([0, Math.max(r.targetK, ...r.readingLag, ...r.sensorLag)]), 'lag, K', theme, ramp, 'time after the ramp starts, s'));
  }
  return out;
}

/**
 * The residual panel: each measured point's residual (the model fitted to all points) and its
 * residual with the model fitted to the other points (what the outlier rule judges), against the
 * rule's limits (± each point's tolerance, a step line through the points); the outlier as a cross.
 */
function residualPanel(r: ResidualSeries, y: number, W: number, theme: PlotTheme, datasets: VegaSpec[]): VegaSpec {
  const pts = [...r.points].sort((a, b) => a.celsius - b.celsius);
  const row = (p: ResidualSeries['points'][number]) => ({ t: r6(p.celsius), r: r6(p.residualK), tol: r6(p.toleranceK), code: p.code, outlier: p.outlier ? 1 : 0, source: p.source });
  const xDomain = pad(extent(pts.map((p) => p.celsius)));
  datasets.push({ name: 'residuals', values: pts.map(row) });
  datasets.push({ name: 'residuals-others', values: pts.filter((p) => p.leaveOneOutK !== null).map((p) => ({ ...row(p), loo: r6(p.leaveOneOutK!) })) });
  datasets.push({ name: 'residual-outliers', values: pts.filter((p) => p.outlier).map((p) => ({ ...row(p), loo: r6(p.leaveOneOutK ?? p.residualK) })) });
  // The limits from edge to edge: each point's tolerance holds halfway to its neighbours.
  const limits = [{ t: xDomain[0], tol: pts[0]!.toleranceK }, ...pts.map((p) => ({ t: p.celsius, tol: p.toleranceK })), { t: xDomain[1], tol: pts.at(-1)!.toleranceK }];
  datasets.push({ name: 'residual-limits', values: limits.map((l) => ({ t: r6(l.t), hi: r6(l.tol), lo: r6(-l.tol) })) });
  const symbol = (name: string, data: string, field: string, colour: string, filled: boolean, shape = 'circle', size = 40): VegaSpec => ({
    type: 'symbol', name, from: { data },
    encode: { enter: { x: { scale: 'x', field: 't' }, y: { scale: 'y', field }, shape: { value: shape }, size: { value: size }, strokeWidth: { value: 1.5 }, ...(filled ? { fill: { value: colour } } : { stroke: { value: colour }, fill: { value: 'transparent' } }) } },
  });
  const inner: VegaSpec[] = [
    { type: 'rule', name: 'residual-zero', encode: { enter: { x: { value: 0 }, x2: { value: W }, y: { scale: 'y', value: 0 }, stroke: { value: theme.muted } } } },
    lineMark('outlier-limit-high', 'residual-limits', 't', 'hi', theme.target, 1.5, 'step', [6, 4]),
    lineMark('outlier-limit-low', 'residual-limits', 't', 'lo', theme.target, 1.5, 'step', [6, 4]),
    symbol('residual-others', 'residuals-others', 'loo', theme.code, false),
    symbol('residual-points', 'residuals', 'r', theme.volts, true),
    symbol('residual-outlier', 'residual-outliers', 'loo', theme.target, true, 'cross', 140),
    {
      type: 'text', name: 'residual-outlier-label', from: { data: 'residual-outliers' },
      encode: { enter: { x: { scale: 'x', field: 't' }, y: { scale: 'y', field: 'loo' }, dx: { value: 9 }, dy: { value: -9 }, text: { field: 'source' }, fill: { value: theme.target }, font: { value: theme.font }, fontSize: { value: theme.fontSize } } },
    },
  ];
  const values = pts.flatMap((p) => [p.residualK, p.toleranceK, -p.toleranceK, ...(p.leaveOneOutK !== null ? [p.leaveOneOutK] : [])]);
  const outliers = pts.filter((p) => p.outlier).length;
  const title = `Residual per point, K: ${pts.length} point${pts.length === 1 ? '' : 's'}, ${outliers === 0 ? 'no outlier' : `${outliers} outlier`}`;
  return panel('residual-panel', y, W, H_ERROR, title, xDomain, pad([Math.min(0, ...values), Math.max(0, ...values)]), 'residual, K', theme, inner);
}

type LegendItem = { label: string; kind: 'band' | 'line' | 'symbol'; colour: string; opacity?: number; dash?: number[]; shape?: string; filled?: boolean };

/** A legend drawn as marks (swatch + label per series) above the error panels. */
function legend(y: number, W: number, e: ErrorSeries, theme: PlotTheme): { mark: VegaSpec; rows: number } {
  const items: LegendItem[] = [
    { label: LABELS.worst, kind: 'band', colour: theme.worst, opacity: theme.worstOpacity },
  ];
  if (e.runs > 0) {
    items.push({ label: LABELS.mcOuter, kind: 'band', colour: theme.mcOuter, opacity: theme.mcOuterOpacity });
    items.push({ label: LABELS.mcInner, kind: 'band', colour: theme.mcInner, opacity: theme.mcInnerOpacity });
    items.push({ label: LABELS.median, kind: 'line', colour: theme.median });
  }
  if (e.targetK !== null) items.push({ label: `${LABELS.target} ±${k3(e.targetK)} K`, kind: 'line', colour: theme.target, dash: [6, 4] });
  if (e.modes.some((m) => m.calibrationCelsius.length > 0)) items.push({ label: LABELS.calibration, kind: 'line', colour: theme.calibration, dash: [2, 3] });
  return legendOf(y, W, items, theme);
}

function legendOf(y: number, W: number, items: LegendItem[], theme: PlotTheme, name = 'legend'): { mark: VegaSpec; rows: number } {
  const marks: VegaSpec[] = [];
  let x = 0;
  let row = 0;
  for (const it of items) {
    // Labels are measured roughly (0.56 em a character); wrap to a new row at the plot's width.
    const w = 30 + it.label.length * (theme.fontSize * 0.56);
    if (x > 0 && x + w > W) (x = 0), row++;
    const r = row * LEGEND_ROW;
    marks.push(it.kind === 'band'
      ? { type: 'rect', encode: { enter: { x: { value: x }, y: { value: r + 2 }, width: { value: 16 }, height: { value: 10 }, fill: { value: it.colour }, fillOpacity: { value: Math.min(1, (it.opacity ?? 1) * 2) } } } }
      : it.kind === 'symbol'
      ? { type: 'symbol', encode: { enter: { x: { value: x + 8 }, y: { value: r + 7 }, shape: { value: it.shape ?? 'circle' }, size: { value: it.shape === 'cross' ? 90 : 40 }, strokeWidth: { value: 1.5 }, ...(it.filled ? { fill: { value: it.colour } } : { stroke: { value: it.colour }, fill: { value: 'transparent' } }) } } }
      : { type: 'rule', encode: { enter: { x: { value: x }, x2: { value: x + 16 }, y: { value: r + 7 }, stroke: { value: it.colour }, strokeWidth: { value: 2 }, ...(it.dash ? { strokeDash: { value: it.dash } } : {}) } } });
    marks.push(textMark(it.label, x + 21, r + 1, theme, { name: `legend-${marks.length}` }));
    x += w;
  }
  return { mark: { type: 'group', name, encode: { enter: { x: { value: 0 }, y: { value: y } } }, marks }, rows: row + 1 };
}

function panel(name: string, y: number, W: number, H: number, title: string, xDomain: [number, number], yDomain: [number, number], yTitle: string, theme: PlotTheme, marks: VegaSpec[], xTitle = 'temperature, °C'): VegaSpec {
  return {
    type: 'group',
    name,
    title: { text: title, offset: 6 },
    encode: { enter: { x: { value: 0 }, y: { value: y }, width: { value: W }, height: { value: H }, stroke: { value: theme.muted }, strokeOpacity: { value: 0.5 } } },
    scales: [
      { name: 'x', type: 'linear', domain: xDomain, range: [0, W], zero: false, nice: false },
      { name: 'y', type: 'linear', domain: yDomain, range: [H, 0], zero: false, nice: true },
    ],
    axes: [
      // gridScale: grid lines span the other scale's range (else they take the root's height).
      { orient: 'bottom', scale: 'x', title: xTitle, grid: true, gridScale: 'y', tickCount: 8 },
      { orient: 'left', scale: 'y', title: yTitle, grid: true, gridScale: 'x', tickCount: 6 },
    ],
    marks,
  };
}

function lineMark(name: string, data: string, x: string, y: string, colour: string, width: number, interpolate = 'linear', dash?: number[]): VegaSpec {
  return {
    type: 'line', name, from: { data },
    encode: { enter: { x: { scale: 'x', field: x }, y: { scale: 'y', field: y }, stroke: { value: colour }, strokeWidth: { value: width }, interpolate: { value: interpolate }, ...(dash ? { strokeDash: { value: dash } } : {}) } },
  };
}

function areaMark(name: string, data: string, low: string, high: string, colour: string, opacity: number): VegaSpec {
  return {
    type: 'area', name, from: { data },
    encode: { enter: { x: { scale: 'x', field: 't' }, y: { scale: 'y', field: high }, y2: { scale: 'y', field: low }, fill: { value: colour }, fillOpacity: { value: opacity } } },
  };
}

function textMark(text: string | string[], x: number, y: number, theme: PlotTheme, extra: { fontSize?: number; fontWeight?: string; fontStyle?: string; fill?: string; name?: string } = {}): VegaSpec {
  return {
    type: 'text', ...(extra.name ? { name: extra.name } : {}),
    encode: { enter: {
      x: { value: x }, y: { value: y }, text: { value: text }, baseline: { value: 'top' },
      fill: { value: extra.fill ?? theme.foreground }, font: { value: theme.font }, fontSize: { value: extra.fontSize ?? theme.fontSize },
      ...(extra.fontWeight ? { fontWeight: { value: extra.fontWeight } } : {}), ...(extra.fontStyle ? { fontStyle: { value: extra.fontStyle } } : {}),
    } },
  };
}

/** Text cut into lines at spaces so each is at most `width` px, measured roughly (0.56 em a character, as the legend). */
export function wrap(text: string, width: number, fontSize: number): string[] {
  const perLine = Math.max(12, Math.floor(width / (fontSize * 0.56)));
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line && line.length + 1 + word.length > perLine) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines;
}

function extent(a: number[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const x of a) if (Number.isFinite(x)) (lo = Math.min(lo, x)), (hi = Math.max(hi, x));
  if (!Number.isFinite(lo)) return [0, 1];
  return lo === hi ? [lo - 0.5, hi + 0.5] : [lo, hi];
}

/** A domain widened by 5 % each side (and never empty), so curves do not touch the frame. */
function pad([lo, hi]: [number, number]): [number, number] {
  const span = hi - lo || Math.max(1e-6, Math.abs(hi) * 0.1);
  return [r6(lo - 0.05 * span), r6(hi + 0.05 * span)];
}

const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);
