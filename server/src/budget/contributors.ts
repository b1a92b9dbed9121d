// The inputs of a channel that vary from board to board or reading to reading, with their
// tolerances from the spec, and how a board with given draws perturbs the channel.
import type { BiasDef, ChannelDef } from '../model/types';
import { trimNumber } from '../model/read-value';
import type { Contributor } from '../analysis/budget-types';
import { kindOf } from '../sensors/registry';

const pct = (r: number) => `± ${trimNumber(r * 100, 3)} %`;

/** Contributors with a non-zero tolerance; board ones first (their order is the draw vector's). */
export function contributorsOf(c: ChannelDef, effectiveOversamplingBits: number): Contributor[] {
  const out: Contributor[] = [];
  const add = (id: string, label: string, scope: Contributor['scope'], amount: number, unit: Contributor['unit']) => {
    if (amount > 0) out.push({ id, label, scope, amount, unit });
  };
  const two = c.secondBias !== undefined;
  // The sensor's own spreads, as its kind states them (sensors/<kind>/).
  const kind = kindOf(c.sensor);
  for (const e of kind.contributors(c.sensor)) add(e.id, e.label, 'board', e.amount, 'relative');
  // The kind's own channel fields (a thermocouple's amplifier offset, cold junction), as it states them.
  for (const e of kind.channelContributors?.(c) ?? []) add(e.id, e.label, e.scope, e.amount, e.unit);
  if (c.amplifier?.gainTolerance) add('amp-gain', `amplifier gain ${pct(c.amplifier.gainTolerance)}`, 'board', c.amplifier.gainTolerance, 'relative');
  const biasTol = (b: BiasDef) => (b.kind === 'current' ? b.amps.tolerance : b.ohms.tolerance);
  const biasWord = (b: BiasDef) => (b.kind === 'current' ? 'bias current' : 'bias resistor');
  add('bias', `${biasWord(c.bias)}${two ? ' 1' : ''} ${pct(biasTol(c.bias))}`, 'board', biasTol(c.bias), 'relative');
  if (c.secondBias) add('bias2', `${biasWord(c.secondBias)} 2 ${pct(biasTol(c.secondBias))}`, 'board', biasTol(c.secondBias), 'relative');
  // Ratiometric: the divider's supply is the converter's reference, so the code is the divider ratio
  // and the rail's value (and tolerance) cancels; neither is an input of the board's error.
  if (!c.ratiometric) {
    if (c.bias.kind !== 'current') add('supply', `supply ${pct(c.bias.supply.tolerance)}`, 'board', c.bias.supply.tolerance, 'relative');
    add('reference', `ADC reference ${pct(c.adc.reference.tolerance)}`, 'board', c.adc.reference.tolerance, 'relative');
  }
  // Two-current: the firmware subtracts two readings of the same converter, so its offset cancels.
  if (!two) add('offset', `ADC offset ± ${trimNumber(c.adc.offsetLsb ?? 0, 3)} LSB`, 'board', c.adc.offsetLsb ?? 0, 'LSB');
  add('gain', `ADC gain error ${pct(c.adc.gainError ?? 0)}`, 'board', c.adc.gainError ?? 0, 'relative');
  // Reading terms: a difference of two readings carries two of each.
  const readings = two ? 2 : 1;
  const q = (0.5 * readings) / 2 ** effectiveOversamplingBits;
  add('quantisation', `quantisation ± ${trimNumber(q, 3)} LSB${effectiveOversamplingBits ? ` (after ${effectiveOversamplingBits} bits of oversampling)` : ''}`, 'reading', q, 'LSB');
  add('inl', `ADC integral nonlinearity ± ${trimNumber((c.adc.inlLsb ?? 0) * readings, 3)} LSB`, 'reading', (c.adc.inlLsb ?? 0) * readings, 'LSB');
  return out;
}

/** Converter figures of one board: reference scale, gain and offset in LSB. */
export interface BoardAdc {
  referenceScale: number;
  gain: number;
  offsetLsb: number;
}

/**
 * The contributors that act on the converter alone (a board's `BoardAdc`), by id, with how a draw
 * sets it: they change the code, never the volts the channel senses (`sensingDraws`).
 */
const CONVERTER: ReadonlyMap<string, (adc: BoardAdc, d: number) => void> = new Map([
  ['reference', (adc: BoardAdc, d: number) => void (adc.referenceScale = 1 + d)],
  ['gain', (adc: BoardAdc, d: number) => void (adc.gain = 1 + d)],
  ['offset', (adc: BoardAdc, d: number) => void (adc.offsetLsb = d)],
]);

/**
 * The draws of u that change what the board's channel senses (every board contributor but the
 * converter's), as a key: two boards with the same key sense the same volts at every temperature.
 */
export function sensingDraws(board: Contributor[], u: ArrayLike<number>): string {
  let key = '';
  for (let i = 0; i < board.length; i++) if (!CONVERTER.has(board[i]!.id)) key += `${u[i]!},`;
  return key;
}

function scaleBias(b: BiasDef, x: number, supplyScale: number): BiasDef {
  if (b.kind === 'current') return { ...b, amps: { ...b.amps, value: b.amps.value * x } };
  return { ...b, ohms: { ...b.ohms, value: b.ohms.value * x }, supply: { ...b.supply, value: b.supply.value * supplyScale } };
}

/** The channel and converter of a board whose board contributors take draws u (each in [-1, 1]). */
export function perturb(c: ChannelDef, board: Contributor[], u: ArrayLike<number>): { channel: ChannelDef; adc: BoardAdc } {
  let b1 = 1;
  let b2 = 1;
  let supply = 1;
  let ampGain = 1;
  const adc: BoardAdc = { referenceScale: 1, gain: 1, offsetLsb: 0 };
  /** Draws of the sensor's own contributors, by id (its kind perturbs the sensor with them). */
  const element = new Map<string, number>();
  for (let i = 0; i < board.length; i++) {
    const k = board[i]!;
    const d = u[i]! * k.amount;
    const setConverter = CONVERTER.get(k.id);
    if (setConverter) {
      setConverter(adc, d);
      continue;
    }
    switch (k.id) {
      case 'bias': b1 = 1 + d; break;
      case 'bias2': b2 = 1 + d; break;
      case 'supply': supply = 1 + d; break;
      case 'amp-gain': ampGain = 1 + d; break;
      default: element.set(k.id, d);
    }
  }
  const s = c.sensor;
  const kind = kindOf(s);
  const channel: ChannelDef = {
    ...c,
    sensor: kind.perturb(s, element),
    bias: scaleBias(c.bias, b1, supply),
    ...(c.secondBias ? { secondBias: scaleBias(c.secondBias, b2, supply) } : {}),
    ...(c.amplifier && ampGain !== 1 ? { amplifier: { ...c.amplifier, gain: c.amplifier.gain * ampGain } } : {}),
  };
  return { channel: kind.perturbChannel ? kind.perturbChannel(channel, element) : channel, adc };
}
