// The fixed part of one channel's budget: temperatures, contributors, calibration settings and the
// nominal inverse; and the error of one board (what the firmware reports minus the true temperature).
//
// The error model, per board and temperature T:
//   code = V_board(T) / (Vref (1 + dRef)) * 2^bits * (1 + dGain) + offset      (continuous code)
//   reported = nominal model inverse of code * Vref / 2^bits                    (what the code computes)
// then the calibration trim (calibration/trim.ts) fitted on the same board's readings at the
// calibration temperatures, each with its own reading errors and the reference thermometer's
// (calibration-readings.ts), then the reading terms (quantisation, INL), converted to K with the
// nominal slope (kelvins per LSB at T).
import type { ChannelDef } from '../model/types';
import { senseEach } from '../analysis/sense';
import { ZERO_CELSIUS_K } from '../physics/constants';
import { applyTrimK, trimFrom, type CalReading, type Trim } from '../calibration/trim';
import { fittedChannel } from '../calibration/fit';
import { NominalInverse } from './nominal-inverse';
import { contributorsOf, perturb, sensingDraws } from './contributors';
import type { CalSetting, Contributor } from '../analysis/budget-types';
import { effectiveOversamplingBits } from './oversampling';
import { calibrationContributors, type CalShift } from './calibration-readings';

export interface BudgetFrame {
  channel: ChannelDef;
  inverse: NominalInverse;
  /** Temperatures of the budget, K. */
  gridK: number[];
  /** gridK followed by the calibration temperatures not already in it, K. */
  evalK: number[];
  modes: CalSetting[];
  /** Per mode, the indices into evalK of its calibration temperatures. */
  calIndex: number[][];
  board: Contributor[];
  reading: Contributor[];
  /** Errors of the calibration readings (calibration-readings.ts). */
  calibration: Contributor[];
  /** Per reading contributor, per grid temperature: its bound in K. */
  readingK: number[][];
  /** Per temperature of evalK: kelvins reported per LSB of code there (signed: the nominal slope's sign). */
  kPerLsb: Float64Array;
  /** Per temperature of evalK: the volts the nominal channel senses there (read with kPerLsb's slope). */
  nominalVolts: Float64Array;
  full: number;
}

/** The spec's calibration first, then the other two modes at their default temperatures. */
export function calSettings(c: ChannelDef): CalSetting[] {
  const room = 25 + ZERO_CELSIUS_K;
  const onePoint = room >= c.lowK && room <= c.highK ? room : (c.lowK + c.highK) / 2;
  const defaults: CalSetting[] = [
    { mode: 'none', kelvins: [] },
    { mode: 'one-point', kelvins: [onePoint] },
    { mode: 'two-point', kelvins: [c.lowK, c.highK] },
  ];
  const stated = c.calibration ? { mode: c.calibration.mode, kelvins: c.calibration.kelvins } : defaults[0]!;
  return [stated, ...defaults.filter((d) => d.mode !== stated.mode)];
}

export function budgetGrid(c: ChannelDef, points: number): number[] {
  const n = Math.max(2, Math.min(points, Math.ceil((c.highK - c.lowK) / c.stepK - 1e-9) + 1));
  return Array.from({ length: n }, (_, i) => (i === n - 1 ? c.highK : c.lowK + ((c.highK - c.lowK) * i) / (n - 1)));
}

export function makeFrame(measuredOrNominal: ChannelDef, points = 49): BudgetFrame {
  // With measured points, the firmware converts with the model fitted to them (outliers left out,
  // calibration/fit.ts), so the budget's boards and reported values start from that model too.
  const c = fittedChannel(measuredOrNominal);
  const all = contributorsOf(c, effectiveOversamplingBits(c));
  const board = all.filter((k) => k.scope === 'board');
  const reading = all.filter((k) => k.scope === 'reading');
  return frameAt({ channel: c, inverse: new NominalInverse(c), modes: calSettings(c), board, reading, calibration: calibrationContributors(c, reading) }, budgetGrid(c, points));
}

/** A frame with the same channel, contributors, modes and inverse at other temperatures (K). */
export function frameAt(base: Pick<BudgetFrame, 'channel' | 'inverse' | 'modes' | 'board' | 'reading' | 'calibration'>, gridK: number[]): BudgetFrame {
  const c = base.channel;
  const evalK = [...gridK];
  const calIndex = base.modes.map((m) =>
    m.kelvins.map((k) => {
      const at = evalK.findIndex((x) => Math.abs(x - k) < 1e-9);
      if (at >= 0) return at;
      evalK.push(k);
      return evalK.length - 1;
    }),
  );
  const lsbVolts = c.adc.reference.value / 2 ** c.adc.bits;
  const nominalVolts = new Float64Array(evalK.length);
  const kPerLsb = new Float64Array(evalK.length);
  senseEach(c, evalK, { volts: nominalVolts, slope: kPerLsb });
  for (let i = 0; i < evalK.length; i++) kPerLsb[i] = lsbVolts / kPerLsb[i]!;
  const readingK = base.reading.map((k) => gridK.map((_, t) => k.amount * Math.abs(kPerLsb[t]!)));
  // Every frame is built with its fields in this one order (not spread from its base, which may be
  // a frame itself): one hidden class for all, so the budget's loops stay optimised for every frame.
  const { inverse, modes, board, reading, calibration } = base;
  return { channel: c, inverse, gridK, evalK, modes, calIndex, board, reading, calibration, readingK, kPerLsb, nominalVolts, full: 2 ** c.adc.bits };
}

/** Volts a board's channel (perturb's `channel`) senses at every temperature of evalK. */
function sensedVolts(f: BudgetFrame, channel: ChannelDef): Float64Array {
  const volts = new Float64Array(f.evalK.length);
  senseEach(channel, f.evalK, { volts });
  return volts;
}

/**
 * The volts each board of one frame senses, kept by its sensing draws (`sensingDraws`): the corners
 * of a worst case come in groups that differ only in the converter's draws, which change the code
 * but not the volts, so each group is sensed once. The board with no draw senses what the nominal
 * channel does (every draw scales by 1 + 0 or adds 0, exactly), the frame's `nominalVolts`. Made
 * for one worst-case evaluation and dropped with it (a Monte Carlo board never repeats its draws).
 */
export class SensedBoards {
  private readonly byDraws = new Map<string, Float64Array>();

  constructor(readonly frame: BudgetFrame) {
    this.byDraws.set(sensingDraws(frame.board, new Float64Array(frame.board.length)), frame.nominalVolts);
  }

  volts(u: ArrayLike<number>, channel: ChannelDef): Float64Array {
    const key = sensingDraws(this.frame.board, u);
    let v = this.byDraws.get(key);
    if (!v) this.byDraws.set(key, (v = sensedVolts(this.frame, channel)));
    return v;
  }
}

/**
 * Error (reported - true, K) of the board with draws u at every temperature of evalK, before
 * calibration; `codes` (optional) receives the board's continuous code there; `sensed` (optional,
 * for the frame f) gives the volts of boards sensed before.
 */
export function boardErrors(f: BudgetFrame, u: ArrayLike<number>, out: Float64Array = new Float64Array(f.evalK.length), codes?: Float64Array, sensed?: SensedBoards): Float64Array {
  const { channel, adc } = perturb(f.channel, f.board, u);
  const volts = sensed ? sensed.volts(u, channel) : sensedVolts(f, channel);
  const vref = f.channel.adc.reference.value;
  const scale = (f.full * adc.gain) / (vref * adc.referenceScale);
  for (let i = 0; i < f.evalK.length; i++) {
    const k = f.evalK[i]!;
    const v = volts[i]!;
    const code = Math.min(f.full, Math.max(0, v * scale + adc.offsetLsb));
    if (codes) codes[i] = code;
    out[i] = f.inverse.kelvinAt((code * vref) / f.full) - k;
  }
  return out;
}

/**
 * The trim a board gets in calibration mode m, from its own errors at the calibration temperatures;
 * `shift` adds each calibration reading's error (rep, K on the reported value) and the reference
 * thermometer's (ref, K on the value the trim aims at).
 */
export function boardTrim(f: BudgetFrame, m: number, errors: ArrayLike<number>, shift?: CalShift): Trim {
  // Pushed, not mapped: `map` gives a mode without points an array of another elements kind, and
  // optimised code meeting it was thrown away (two of a cold `check`'s deoptimisations).
  const readings: CalReading[] = [];
  const at = f.calIndex[m]!;
  for (let j = 0; j < at.length; j++) {
    const i = at[j]!;
    readings.push({ trueK: f.evalK[i]! + (shift ? shift.ref[j]! : 0), reportedK: f.evalK[i]! + errors[i]! + (shift ? shift.rep[j]! : 0) });
  }
  return trimFrom(readings);
}

/** Calibrated error at each grid temperature (before reading terms); returns the trim's gain. */
export function calibrated(f: BudgetFrame, m: number, errors: ArrayLike<number>, out: Float64Array, shift?: CalShift): number {
  const t = boardTrim(f, m, errors, shift);
  for (let i = 0; i < f.gridK.length; i++) {
    const k = f.gridK[i]!;
    out[i] = applyTrimK(t, k + errors[i]!) - k;
  }
  return t.gain;
}

/** kPerLsb at the calibration temperatures of mode m. */
export function kPerLsbAtCal(f: BudgetFrame, m: number): number[] {
  return f.calIndex[m]!.map((i) => f.kPerLsb[i]!);
}
