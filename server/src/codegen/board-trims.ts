// Production trim: each board's constants for the generated `<channel>_set_trim()`, from the board's
// calibration readings (reference temperature and ADC code at the spec's one or two points).
// The arithmetic is the generated C's own (calibration.ts): the untrimmed value is the conversion
// kernel's integer output for the code (simulated exactly, generate.ts), the offset is in output
// units (int16) and the gain in Q14 (8192 .. 24575, 0.5 .. 1.5), applied as
// y + floor((y D + 2^15) / 2^16) + O with D = 4 G - 65536; the offset bounds are the setter's.
// A board whose readings lie outside what the design's tolerances allow (its untrimmed error beyond
// the worst-case band of the error budget with no calibration, widened by the reference
// thermometer's uncertainty, the conversion's own error and one count), or whose trim the setter
// would cut, is listed as suspect with the reason and given no trim.
import { planChannels, kernelAt } from './generate';
import { rounded } from './samples';
import { applyTrim, integerTrim, GAIN_Q, GAIN_Q_MAX, GAIN_Q_MIN, TWO_POINT_FRAC, type TrimDesign } from './calibration';
import type { ConversionInput } from './types';
import type { BudgetResult } from '../analysis/budget-types';
import type { ChannelDef } from '../model/types';
import { ZERO_CELSIUS_K } from '../physics/constants';

export interface BoardReading {
  board: string;
  /** Row of the readings file (for messages). */
  row: number;
  kelvin: number;
  /** The value passed to the conversion: the ADC code (or the decimated value with oversampling). */
  code: number;
}

export interface BoardPoint {
  celsius: number;
  code: number;
  row: number;
  /** The conversion's output before any trim, in output units and °C. */
  untrimmedUnits: number;
  untrimmedC: number;
  /** Untrimmed minus reference, K; and the band of the design with no calibration there. */
  errorK: number;
  allowedLowK: number;
  allowedHighK: number;
  /** The conversion's output with the board's trims, °C (null for a suspect board). */
  correctedC: number | null;
}

export interface BoardTrim {
  board: string;
  /** `trimmed`: constants below; `suspect`: none, see `reasons`. */
  status: 'trimmed' | 'suspect';
  reasons: string[];
  /** Offset in output units (1/scale °C), as `_set_trim` takes it. */
  offsetUnits: number;
  /** Gain * 2^14 (two-point only). */
  gainQ14?: number;
  points: BoardPoint[];
  /** Largest |corrected - reference| at the board's calibration points, K. */
  worstAtPointsK: number | null;
  /** Remaining worst-case error over the range after this calibration: the budget's, plus the conversion's own, K. */
  remainingWorstK: number;
}

export interface TrimRun {
  mode: 'one-point' | 'two-point';
  /** Output units per °C. */
  scale: number;
  /** C identifier stem of the channel's generated functions. */
  ident: string;
  trims: BoardTrim[];
  /** One count of the converter in °C at each calibration temperature (the test's tolerance). */
  countK: number[];
}

/** Linear interpolation of a band over the budget's temperatures (°C). */
function bandAt(celsius: number[], low: number[], high: number[], t: number): { low: number; high: number } {
  if (t <= celsius[0]!) return { low: low[0]!, high: high[0]! };
  for (let i = 1; i < celsius.length; i++) {
    if (t <= celsius[i]!) {
      const w = (t - celsius[i - 1]!) / (celsius[i]! - celsius[i - 1]!);
      return { low: low[i - 1]! + w * (low[i]! - low[i - 1]!), high: high[i - 1]! + w * (high[i]! - high[i - 1]!) };
    }
  }
  const n = celsius.length - 1;
  return { low: low[n]!, high: high[n]! };
}

/**
 * Trims for every board of `readings` (grouped by board, in first-seen order). `input`: the channel's
 * conversion input (its run-time trim mode from the spec's calibration); `budget`: the channel's
 * worst-case budget; `progress` is called after each board.
 */
export function boardTrims(c: ChannelDef, input: ConversionInput, budget: BudgetResult, readings: readonly BoardReading[], progress?: (done: number, total: number) => void): TrimRun {
  const mode = input.calibration.mode === 'offset' ? 'one-point' : input.calibration.mode === 'two-point' ? 'two-point' : null;
  if (!mode) throw new Error('the channel has no calibration, so its generated code has no trims to set');
  const { plans, samples } = planChannels([input]);
  const plan = plans[0]!;
  const s = samples[0]!;
  const scale = input.outputScale;
  // The value the trim takes (calibration.ts): output units, or for a two-point trim half units.
  const raw = (code: number) => rounded(s, kernelAt(plan.design, s, code));
  const per = mode === 'two-point' ? 2 ** TWO_POINT_FRAC : 1;
  const untrimmed = (code: number) => raw(code) / per;
  const none = budget.modes.find((m) => m.setting.mode === 'none')!;
  const stated = budget.modes.find((m) => m.setting.mode === mode) ?? budget.stated;
  const refK = c.calReferenceK ?? 0;
  const lsbVolts = c.adc.reference.value / 2 ** c.adc.bits;
  const calKs = c.calibration?.kelvins ?? [];
  // One count in K at a temperature: the conversion's step at the code whose output is nearest.
  const outs = Int32Array.from({ length: plan.high - plan.low + 1 }, (_, i) => untrimmed(plan.low + i));
  const countAt = (celsius: number) => {
    const want = celsius * scale;
    let best = 0;
    for (let i = 1; i < outs.length; i++) if (Math.abs(outs[i]! - want) < Math.abs(outs[best]! - want)) best = i;
    const j = best + 1 < outs.length ? best + 1 : best - 1;
    return j >= 0 ? Math.abs(outs[j]! - outs[best]!) / scale : lsbVolts;
  };
  const groups = new Map<string, BoardReading[]>();
  for (const r of readings) {
    const g = groups.get(r.board);
    if (g) g.push(r);
    else groups.set(r.board, [r]);
  }
  const need = mode === 'one-point' ? 1 : 2;
  const trims: BoardTrim[] = [];
  let done = 0;
  for (const [board, rs] of groups) {
    const reasons: string[] = [];
    const pts: BoardPoint[] = rs.map((r) => {
      const celsius = r.kelvin - ZERO_CELSIUS_K;
      const inRange = r.code >= plan.low && r.code <= plan.high;
      const y = inRange ? untrimmed(r.code) : NaN;
      const band = bandAt(budget.celsius, none.worstLow, none.worstHigh, celsius);
      const slack = refK + plan.maxErrorC + countAt(celsius);
      const errorK = y / scale - celsius;
      if (!inRange) reasons.push(`row ${r.row}: code ${r.code} is outside the channel's codes ${plan.low}..${plan.high}, where the conversion clamps and no trim can be fitted (a board this far off the nominal design needs the range widened, or is faulty)`);
      else if (!(errorK >= band.low - slack && errorK <= band.high + slack)) {
        reasons.push(`row ${r.row}: at ${+celsius.toFixed(3)} °C the code reads ${+(y / scale).toFixed(3)} °C, ${+errorK.toFixed(3)} K off, outside the ${+(band.low - slack).toFixed(3)} .. +${+(band.high + slack).toFixed(3)} K that a board within the design's tolerances can be (a wrong part, a bad joint, or a wrong reading)`);
      }
      return { celsius, code: r.code, row: r.row, untrimmedUnits: y, untrimmedC: y / scale, errorK, allowedLowK: band.low - slack, allowedHighK: band.high + slack, correctedC: null };
    });
    if (rs.length !== need) reasons.push(`${rs.length} reading${rs.length === 1 ? '' : 's'} (rows ${rs.map((r) => r.row).join(', ')}); the channel's ${mode} calibration takes ${need}`);
    if (need === 2 && rs.length === 2 && Math.abs(rs[0]!.kelvin - rs[1]!.kelvin) < 1e-6) reasons.push('both readings are at one temperature; a two-point trim needs two');
    let trim: TrimDesign | null = null;
    if (reasons.length === 0) {
      const target = pts.map((p) => p.celsius * scale);
      const ys = pts.map((p) => p.untrimmedUnits);
      if (mode === 'one-point') {
        trim = integerTrim('offset', Math.round(target[0]! - ys[0]!), 1 << GAIN_Q);
      } else {
        const gain = (target[1]! - target[0]!) / (ys[1]! - ys[0]!);
        const gainQ = Math.round(gain * 2 ** GAIN_Q);
        if (!(gainQ >= GAIN_Q_MIN && gainQ <= GAIN_Q_MAX)) reasons.push(`its gain would be ${+gain.toFixed(4)}, outside the 0.5 .. 1.5 the generated setter holds`);
        else {
          const bare = integerTrim('two-point', 0, gainQ);
          const corr = (y: number) => applyTrim(bare, y * per);
          const offset = Math.round((target[0]! - corr(ys[0]!) + target[1]! - corr(ys[1]!)) / 2);
          trim = integerTrim('two-point', offset, gainQ);
        }
      }
    }
    if (trim && plan.outBits === 16) {
      // The setter's bounds (emit.ts trimRuntimeSetter): no in-range output may leave int16_t.
      const bare = integerTrim(trim.mode === 'offset' ? 'offset' : 'two-point', 0, trim.gainQ);
      const lo = applyTrim(bare, plan.kernelMin);
      const hi = applyTrim(bare, plan.kernelMax);
      if (trim.offsetScaled > 32767 - hi || trim.offsetScaled < -32768 - lo || Math.abs(trim.offsetScaled) > 32767) {
        reasons.push(`its offset ${trim.offsetScaled} units would be cut by the setter (allowed ${-32768 - lo} .. ${32767 - hi})`);
        trim = null;
      }
    }
    if (reasons.length > 0) trim = null;
    let worstAtPointsK: number | null = null;
    if (trim) {
      const t = trim;
      worstAtPointsK = 0;
      for (const p of pts) {
        p.correctedC = applyTrim(t, p.untrimmedUnits * per) / scale;
        worstAtPointsK = Math.max(worstAtPointsK, Math.abs(p.correctedC - p.celsius));
      }
    }
    trims.push({
      board,
      status: trim ? 'trimmed' : 'suspect',
      reasons,
      offsetUnits: trim?.offsetScaled ?? 0,
      ...(mode === 'two-point' ? { gainQ14: trim?.gainQ ?? 1 << GAIN_Q } : {}),
      points: pts,
      worstAtPointsK,
      remainingWorstK: stated.worstAbsK + plan.maxErrorC,
    });
    progress?.(++done, groups.size);
  }
  return { mode, scale, ident: plan.ident, trims, countK: calKs.map((k) => countAt(k - ZERO_CELSIUS_K)) };
}

/** A board id as C string literal text: printable ASCII kept (quote and backslash escaped), the rest as octal escapes. */
export function cString(text: string): string {
  let out = '';
  for (const b of Buffer.from(text, 'utf8')) {
    if (b === 0x22 || b === 0x5c) out += '\\' + String.fromCharCode(b);
    // `?` escaped too: two of them could start a trigraph (C99 5.2.1.1).
    else if (b >= 0x20 && b < 0x7f && b !== 0x3f) out += String.fromCharCode(b);
    else out += '\\' + b.toString(8).padStart(3, '0');
  }
  return `"${out}"`;
}

/** A CSV cell: quoted when it holds a comma, quote or line break (RFC 4180). */
function csvCell(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function trimsCsv(run: TrimRun, caution: string): string {
  const head = ['board', 'status', 'offset_units', ...(run.mode === 'two-point' ? ['gain_q14'] : []), 'worst_at_points_k', 'remaining_worst_k', 'reason'];
  const lines = [`# ${caution.replace(/\s*\n\s*/g, ' ')}`, head.join(',')];
  for (const t of run.trims) {
    lines.push([csvCell(t.board), t.status, String(t.offsetUnits), ...(run.mode === 'two-point' ? [String(t.gainQ14)] : []), t.worstAtPointsK === null ? '' : t.worstAtPointsK.toFixed(4), t.remainingWorstK.toFixed(4), csvCell(t.reasons.join('; '))].join(','));
  }
  return lines.join('\n') + '\n';
}

export function trimsJson(run: TrimRun, channel: string, caution: string): string {
  return JSON.stringify({ channel, mode: run.mode, outputUnitsPerC: run.scale, setter: `${run.ident}_set_trim`, boards: run.trims, caution }, null, 2) + '\n';
}

/** A C initialiser of the trimmed boards (suspect boards left out, named in a comment). */
export function trimsC(run: TrimRun, caution: string): string {
  const id = run.ident;
  const two = run.mode === 'two-point';
  const ok = run.trims.filter((t) => t.status === 'trimmed');
  const suspect = run.trims.filter((t) => t.status === 'suspect');
  const lines = [
    `/* Per-board trims for ${id}_set_trim(): offset in 1/${run.scale} degC${two ? ', gain * 2^14' : ''}.`,
    ...caution.split('\n').map((l) => ` * ${l.replace(/\*\//g, '* /')}`),
    ...(suspect.length ? [` * Suspect boards, not trimmed: ${suspect.length} (see the report).`] : []),
    ' */',
    '#include <stdint.h>',
    `struct ${id}_board_trim {`,
    '    const char *board;',
    '    int16_t offset_units;',
    ...(two ? ['    uint16_t gain_q14;'] : []),
    '};',
    `const struct ${id}_board_trim ${id}_board_trims[${Math.max(ok.length, 1)}] = {`,
    ...(ok.length ? ok.map((t) => `    { ${cString(t.board)}, ${t.offsetUnits}${two ? `, ${t.gainQ14}u` : ''} },`) : [`    { 0, 0${two ? ', 16384u' : ''} } /* no board trimmed */`]),
    '};',
    `const unsigned ${id}_board_trim_count = ${ok.length}u;`,
  ];
  return lines.join('\n') + '\n';
}
