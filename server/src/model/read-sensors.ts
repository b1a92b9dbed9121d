// Readers of the channel fields that concern its sensor: the sensor reference, the bias,
// ratiometric reading, amplifier, lead wiring and comparison group, each checked against what the
// sensor's kind takes (sensors/kind.ts). resolve.ts builds the BlockReader and calls these; they
// report with precise ranges and never throw.
import type { QuantityTerm, Term } from '../syntax/ast';
import type { BlockReader, Resolution } from './block-reader';
import type { AdcDef, BiasDef, ChannelDef, SensorDef, WiringDef } from './types';
import { noExtra, readPart, readQuantityValue, readTolerance, spanOf, formatSI } from './read-value';
import { kindWithArticle, PART_DOMAINS } from './schema';
import { closest } from './suggest';
import { kindOf, kindsInWords, kindsTakingOnly, kindTakes, sensorKind, sensorKinds } from '../sensors/registry';
import { shown } from '../diagnostics/shown';

/** The channel's `sensor`: a definition of any sensor kind. */
export function readSensorRef(r: BlockReader, res: Resolution): SensorDef | null {
  const terms = r.terms('sensor');
  if (!terms) {
    r.missing('sensor');
    return null;
  }
  const t = terms[0]!;
  if (t.kind !== 'word') {
    r.sink.report('bad-value', r.ref.file, spanOf(terms), `sensor takes the name of ${kindsInWords()} definition`);
    r.ok = false;
    return null;
  }
  if (!noExtra(terms, 1, r.ctx('sensor'))) r.ok = false;
  const block = res.blocks.get(t.text);
  if (!block) {
    const pool = [...res.blocks.values()].filter((b) => sensorKind(b.kind)).map((b) => b.node.name.text);
    const near = closest(t.text, pool);
    r.sink.report('unknown-name', r.ref.file, t.span, `no sensor named '${shown(t.text)}' is defined${near ? ` (did you mean '${near}'?)` : pool.length ? `; defined: ${pool.join(', ')}` : ''}`);
    r.ok = false;
    return null;
  }
  if (!sensorKind(block.kind)) {
    r.sink.report('wrong-kind', r.ref.file, t.span, `'${shown(t.text)}' is ${kindWithArticle(block.kind)}, but sensor needs ${kindsInWords()}`);
    r.ok = false;
    return null;
  }
  const def = res.sensors.get(t.text);
  if (!def) r.ok = false;
  return def ?? null;
}

/** `current I`, `resistor R from V` or `divider R above|below from V`, each value with an optional tolerance. */
export function readBias(r: BlockReader): BiasDef | null {
  const terms = r.terms('bias');
  if (!terms) {
    r.missing('bias');
    return null;
  }
  const ctx = r.ctx('bias');
  const span = spanOf(terms);
  const head = terms[0]!;
  const tol = (q: QuantityTerm, value: number, dim: 'resistance' | 'voltage' | 'current') => (q.tolerance ? readTolerance(q.tolerance, value, dim, ctx) : 0);
  const word = head.kind === 'word' ? head.text : '';
  if (word === 'current') {
    const q = terms[1];
    if (!q || q.kind !== 'quantity' || !noExtra(terms, 2, ctx)) return refuseBias(r, terms);
    const amps = readPart(q, PART_DOMAINS.biasCurrent, ctx);
    const t = amps === null ? null : tol(q, amps, 'current');
    if (amps === null || t === null) return (r.ok = false), null;
    return { kind: 'current', amps: { value: amps, tolerance: t, span: q.span }, span };
  }
  if (word !== 'resistor' && word !== 'divider') return refuseBias(r, terms);
  // A resistor from a supply; a divider's also says which side the fixed resistor is on.
  const divider = word === 'divider';
  const [, rq, ...rest] = terms;
  const pos = divider ? rest.shift() : undefined;
  const [from, vq] = rest;
  const position = pos?.kind === 'word' && (pos.text === 'above' || pos.text === 'below') ? pos.text : undefined;
  if (!rq || rq.kind !== 'quantity' || (divider && !position) || !from || from.kind !== 'word' || from.text !== 'from' || !vq || vq.kind !== 'quantity' || !noExtra(terms, divider ? 5 : 4, ctx)) return refuseBias(r, terms, divider);
  const ohms = readPart(rq, PART_DOMAINS.biasResistor, ctx);
  const volts = readPart(vq, PART_DOMAINS.supply, ctx);
  if (ohms === null || volts === null) return (r.ok = false), null;
  const rt = tol(rq, ohms, 'resistance');
  const vt = tol(vq, volts, 'voltage');
  if (rt === null || vt === null) return (r.ok = false), null;
  const ends = { ohms: { value: ohms, tolerance: rt, span: rq.span }, supply: { value: volts, tolerance: vt, span: vq.span } };
  return divider ? { kind: 'divider', ...ends, position: position!, span } : { kind: 'resistor', ...ends, span };
}

function refuseBias(r: BlockReader, terms: Term[], divider = false): null {
  return r.refuse('bias', terms, divider
    ? 'a divider bias reads `divider R above from V` (fixed resistor on the supply side) or `divider R below from V` (fixed resistor to ground), e.g. `divider 10k ± 0.1 % above from 3.3 V`'
    : 'bias takes `resistor R from V` (e.g. `resistor 47k ± 1 % from 3.3 V`) or `current I` (e.g. `current 100 uA`)');
}

/** `2 wires 0.5 ohm`, `3 wires 0.5 ohm`, `4 wires`. */
function readWiring(r: BlockReader): WiringDef | null | undefined {
  const terms = r.terms('wiring');
  if (!terms) return undefined;
  const span = spanOf(terms);
  const bad = () => {
    r.sink.report('bad-value', r.ref.file, span, 'wiring takes `2 wires 0.5 ohm`, `3 wires 0.5 ohm` or `4 wires` (the resistance is that of one lead)');
    r.ok = false;
    return null;
  };
  const [n, w, q] = terms;
  if (!n || n.kind !== 'quantity' || n.unit || !w || w.kind !== 'word' || (w.text !== 'wires' && w.text !== 'wire')) return bad();
  const wires = n.number.value;
  if (wires !== 2 && wires !== 3 && wires !== 4) {
    r.sink.report('out-of-domain', r.ref.file, n.span, `wiring: a sensor has 2, 3 or 4 wires (found ${shown(n.number.text)})`);
    return (r.ok = false), null;
  }
  let lead = 0;
  if (q) {
    if (q.kind !== 'quantity' || !noExtra(terms, 3, r.ctx('wiring'))) return bad();
    const v = readQuantityValue(q, 'resistance', r.ctx('wiring'));
    if (v === null) return (r.ok = false), null;
    if (!(v >= 0) || v > 1e4) {
      r.sink.report('out-of-domain', r.ref.file, q.span, `wiring: the lead resistance must be from 0 Ω to 10 kΩ (found ${shown(q.number.text)})`);
      return (r.ok = false), null;
    }
    lead = v;
  } else if (wires !== 4) {
    r.sink.report('bad-value', r.ref.file, span, `wiring: give the resistance of one lead, e.g. \`${wires} wires 0.5 ohm\``);
    return (r.ok = false), null;
  }
  return { wires, leadOhms: lead, span };
}

export interface ChannelExtras {
  ratiometric?: boolean;
  amplifier?: { gain: number; offsetVolts: number; gainTolerance?: number };
  wiring?: WiringDef;
  compareGroup?: string;
  kindFields?: object;
}

/** The channel fields that depend on the sensor's kind, checked against its sensor, bias and ADC. */
export function readChannelExtras(r: BlockReader, sensor: SensorDef | null, bias: BiasDef | null, adc: AdcDef | null, range?: { low: number; high: number } | null, channel: (field: string) => ChannelDef | null = () => null): ChannelExtras {
  const out: ChannelExtras = {};
  const file = r.ref.file;
  const kind = sensor ? kindOf(sensor) : null;
  const elementMsg = sensor && range ? kind!.rangeProblem?.(sensor, range.low, range.high) ?? null : null;
  if (elementMsg) {
    r.sink.report('out-of-domain', file, r.fieldSpans['range'] ?? r.ref.node.name.span, elementMsg);
    r.ok = false;
  }
  const takes = (field: string) => kind === null || kindTakes(kind, field);
  const notTaken = (field: string) => {
    const by = kindsTakingOnly(field).map((k) => k.name);
    r.sink.report('bad-value', file, r.fieldSpans[field]!, `${field} applies to ${by.join(' and ')} channels; '${sensor!.name}' is a ${kind!.name}`);
    r.ok = false;
  };
  const biasProblem = sensor && bias ? kind!.biasProblem(sensor, bias) : null;
  if (biasProblem) {
    r.sink.report('bad-value', file, bias!.span, biasProblem);
    r.ok = false;
  }
  const ratio = r.choice('ratiometric', 'no');
  if (r.terms('ratiometric') && ratio === 'yes') {
    if (!bias || bias.kind !== 'divider') {
      if (bias) {
        r.sink.report('bad-value', file, r.fieldSpans['ratiometric']!, 'ratiometric = yes needs a divider bias (the ADC reference is the divider supply)');
        r.ok = false;
      }
    } else if (adc && Math.abs(bias.supply.value - adc.reference.value) > 1e-9 * adc.reference.value) {
      r.sink.report('out-of-domain', file, bias.supply.span, `ratiometric: the divider supply (${formatSI(bias.supply.value, 'V')}) must be the same rail as the reference of '${adc.name}' (${formatSI(adc.reference.value, 'V')})`);
      r.ok = false;
    } else out.ratiometric = true;
  }
  // Every field given that only other kinds take (sensors/kind.ts `channelFields`), in one place.
  if (kind) for (const f of new Set(sensorKinds().flatMap((k) => k.channelFields))) if (r.terms(f) && !takes(f)) notTaken(f);
  const hasAmp = r.terms('gain') !== undefined || r.terms('offset') !== undefined;
  if (hasAmp) {
    if (takes('gain') && takes('offset')) {
      const g = r.quantity('gain', 1);
      const o = r.quantity('offset', 0);
      // Domains (schema.ts) are checked as they are read.
      if (g && o) out.amplifier = { gain: g.value, offsetVolts: o.value, ...(g.tolerance > 0 ? { gainTolerance: g.tolerance } : {}) };
    }
  }
  const wiring = readWiring(r);
  if (wiring && takes('wiring')) out.wiring = wiring;
  // The kind's own reading of the fields only it takes.
  if (sensor && kind!.readChannel) {
    const own = kind!.readChannel(r, { sensor, bias, range: range ?? null, channel });
    if (own) out.kindFields = own;
    else r.ok = false;
  }
  const g = r.terms('compare_group');
  if (g) {
    const w = g[0]!;
    if (w.kind !== 'word' || !noExtra(g, 1, r.ctx('compare_group'))) {
      r.sink.report('bad-value', file, spanOf(g), 'compare_group takes a name such as `fridge`');
      r.ok = false;
    } else out.compareGroup = w.text;
  }
  return out;
}

