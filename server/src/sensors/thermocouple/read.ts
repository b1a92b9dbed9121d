// Reads a thermocouple block (type, class, rated range) and a thermocouple channel's own fields
// (cold-junction channel, isothermal difference, amplifier input offset and drift, output swing, loop
// resistance), with precise diagnostics. The open-detection scheme is the channel's `bias`.
import type { BlockReader } from '../../model/block-reader';
import type { BiasDef, DefBase } from '../../model/types';
import type { Term } from '../../syntax/ast';
import type { KindChannelReading } from '../kind';
import { formatSI, noExtra, readPart, readRange, spanOf, trimNumber } from '../../model/read-value';
import { boundTerm } from '../../model/read-budget-spec';
import { shown } from '../../diagnostics/shown';
import { referenceRange, type TcType } from './its90';
import { classesOf, type TcClass } from './tolerance';
import { DOMAINS } from './block';
import { COLD_JUNCTION, type TcChannel, type ThermocoupleDef } from './types';

const ZERO_C = 273.15;

export function readThermocouple(r: BlockReader, base: DefBase): ThermocoupleDef | null {
  if (!r.terms('type')) r.missing('type');
  const type = r.choice('type', 'K') as TcType;
  const cls = r.terms('class') ? r.quantity('class') : null;
  const table = referenceRange(type);
  const rated = r.range('rated', [table.lowK, table.highK]);
  if (!r.ok || !rated || (r.terms('class') && !cls)) return null;
  if (rated.low < table.lowK - 1e-9 || rated.high > table.highK + 1e-9) {
    r.sink.report('out-of-domain', r.ref.file, r.fieldSpans['rated'] ?? r.ref.node.name.span,
      `thermocouple '${shown(r.ref.node.name.text)}': rated ${trimNumber(rated.low - ZERO_C, 5)} °C .. ${trimNumber(rated.high - ZERO_C, 5)} °C leaves the range of the type ${type} reference function, ${trimNumber(table.lowK - ZERO_C, 5)} °C .. ${trimNumber(table.highK - ZERO_C, 5)} °C (NIST Monograph 175)`);
    return null;
  }
  if (cls && !classesOf(type).includes(cls.value as TcClass)) {
    r.sink.report('out-of-domain', r.ref.file, r.fieldSpans['class']!, `class: IEC 60584-1 gives type ${type} class${classesOf(type).length > 1 ? 'es' : ''} ${classesOf(type).join(' and ')} only (found ${trimNumber(cls.value, 3)})`);
    return null;
  }
  return {
    kind: 'thermocouple', ...base, params: { kind: `type ${type}`, type },
    toleranceClass: cls ? (cls.value as TcClass) : null,
    ratedLowK: rated.low, ratedHighK: rated.high,
    // A thermocouple carries no measuring current of its own: no self-heating.
    thetaJA: 0,
  };
}

/** Why a bias does not suit a thermocouple: it must say how an open thermocouple is detected. */
export function tcBiasProblem(_s: ThermocoupleDef, bias: BiasDef): string | null {
  return bias.kind === 'divider'
    ? 'a thermocouple takes no divider: its bias is the open-thermocouple detection, `resistor R from V` (a pull-up, e.g. `resistor 10 Mohm from 3.3 V`) or `current I` (a burnout current, e.g. `current 1 uA`)'
    : null;
}

/** `± v` (or `v`): a non-negative half-width in the domain. */
function readBound(r: BlockReader, field: string, domain: (typeof DOMAINS)[keyof typeof DOMAINS], words: number, example: string): number | null | undefined {
  const terms = r.terms(field);
  if (!terms) return undefined;
  const ctx = r.ctx(field);
  const q = boundTerm(terms);
  const rest = terms.slice(1);
  const ok = words === 0 ? rest.length === 0 : rest.length === 2 && isWord(rest[0], 'per') && isWord(rest[1], 'K');
  if (!q || !ok) {
    if (q && words === 0) noExtra(terms, 1, ctx);
    else r.sink.report('bad-value', r.ref.file, spanOf(terms), `${field} takes ${example}`);
    r.ok = false;
    return null;
  }
  const v = readPart(q, domain, ctx);
  if (v === null) r.ok = false;
  return v === null ? null : Math.abs(v);
}

function isWord(t: Term | undefined, text: string): boolean {
  return !!t && ((t.kind === 'word' && t.text === text) || (t.kind === 'unit' && t.text === text));
}

/** The thermocouple channel's own fields; null when one has errors (reported). */
export function readTcChannel(r: BlockReader, at: KindChannelReading<ThermocoupleDef>): TcChannel | null {
  const file = r.ref.file;
  const cj = at.channel(COLD_JUNCTION);
  const iso = readBound(r, 'isothermal', DOMAINS.isothermal, 0, 'a temperature difference such as `± 0.5 °C`');
  const vos = readBound(r, 'input_offset', DOMAINS.inputOffset, 0, 'a voltage such as `± 25 uV`');
  const drift = readBound(r, 'offset_drift', DOMAINS.offsetDrift, 2, 'a voltage per kelvin such as `± 0.1 uV per K`');
  const loop = r.quantity('loop_resistance', 10);
  const swingTerms = r.terms('output_swing');
  const swing = swingTerms ? readRange(swingTerms, 'voltage', r.ctx('output_swing')) : undefined;
  if (swing === null) r.ok = false;
  if (cj && cj.sensor.kind === 'thermocouple') {
    r.sink.report('bad-value', file, r.fieldSpans[COLD_JUNCTION]!, `${COLD_JUNCTION}: '${shown(cj.name)}' is itself a thermocouple channel, whose reading needs a cold junction of its own; name a junction, thermistor or RTD channel that measures the terminals`);
    r.ok = false;
    return null;
  }
  if (cj) {
    const t = referenceRange(at.sensor.params.type);
    if (cj.lowK < t.lowK || cj.highK > t.highK) {
      r.sink.report('out-of-domain', file, r.fieldSpans[COLD_JUNCTION]!, `${COLD_JUNCTION}: the range of '${shown(cj.name)}', ${trimNumber(cj.lowK - ZERO_C, 4)} °C .. ${trimNumber(cj.highK - ZERO_C, 4)} °C, leaves the type ${at.sensor.params.type} reference function's range, ${trimNumber(t.lowK - ZERO_C, 5)} °C .. ${trimNumber(t.highK - ZERO_C, 5)} °C`);
      r.ok = false;
    }
  }
  if (swing && (swing.low < -1000 || swing.high > 1000)) {
    r.sink.report('out-of-domain', file, swing.span, `output_swing must lie within -1000 V .. 1000 V (found ${formatSI(swing.low, 'V')} .. ${formatSI(swing.high, 'V')})`);
    r.ok = false;
  }
  if (!r.ok || !cj || iso === null || vos === null || drift === null || !loop) return null;
  return {
    inputOffsetVolts: vos ?? 0,
    offsetDriftVoltsPerK: drift ?? 0,
    swing: swing ? { lowV: swing.low, highV: swing.high } : null,
    isothermalK: iso ?? 0,
    loopOhms: loop.value,
  };
}
