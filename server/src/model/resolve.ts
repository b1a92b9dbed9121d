// Resolves parsed blocks into typed definitions (base SI units, defaults applied), reporting
// unknown blocks and fields, duplicates, missing fields, wrong units and out-of-domain values.
import type { Term, TopItem } from '../syntax/ast';
import { pieceOrigin } from '../syntax/parse';
import { contentToken, movedCopy, sameContent } from './moved';
import { shiftOffsets } from '../syntax/shift';
import { DiagnosticSink } from '../diagnostics/diagnostic';
import { blockKinds, blockSpec, kindWithArticle, PART_DOMAINS } from './schema';
import type { LoadedFile } from './workspace';
import type { AdcDef, ChannelDef, CodegenSpec, DefBase } from './types';
import { noExtra, readPart, trimNumber, spanOf } from './read-value';
import { readUnit } from './units';
import { closest } from './suggest';
import { prefixProblem } from './code-prefix';
import { readBias, readChannelExtras, readSensorRef } from './read-sensors';
import { BlockReader, type BlockRef, type Resolution } from './block-reader';
import { kindOf, kindsInWords, sensorKind, sensorKinds } from '../sensors/registry';
import { isTwoCurrentBias, readBenchRef, readDynamics, readCalReference, readCalibration, readLsbBound, readMeasured, readMonteCarlo, readNoise, readOversampling, readRelativeBound, readTwoCurrentBias } from './read-budget-spec';
import { shown } from '../diagnostics/shown';

/**
 * `kept`: the document's definitions by piece (document-state.ts), read and added to, so the next
 * resolve of the same document re-reads only the blocks whose text changed (its parse cache gives
 * unchanged blocks the same nodes). Without it nothing is kept.
 */
export function resolveModel(files: LoadedFile[], sink: DiagnosticSink, kept?: KeptDefinitions): Resolution {
  const entry = files[0]!;
  const blocks = declaredBlocks(files, sink);
  const res: Resolution = { blocks, sensors: new Map(), adcs: new Map(), channels: [] };
  for (const ref of blocks.values()) {
    const kind = sensorKind(ref.kind);
    if (kind) {
      const d = remembered(ref, sink, kept, (into) => {
        const r = new BlockReader(ref, kind.block, into);
        return kind.read(r, base(ref, r));
      });
      if (d) res.sensors.set(d.name, d);
    } else if (ref.kind === 'adc') {
      const a = remembered(ref, sink, kept, (into) => readAdc(ref, into));
      if (a) res.adcs.set(a.name, a);
    }
  }
  // Channels are read on demand, so a channel naming another (a thermocouple's cold junction) reads
  // that one first; each is read once, and a channel met again while it is being read is a cycle.
  const read = new Map<string, ChannelDef | null>();
  const reading = new Set<string>();
  const channels: ChannelReader = (name) => {
    const done = read.get(name);
    if (done !== undefined) return done;
    if (reading.has(name)) return 'cycle';
    const ref = blocks.get(name);
    // Only the entry file's channels are read (a kept channel may name one renamed or moved away since).
    if (!ref || ref.kind !== 'channel' || ref.file !== entry.path) return null;
    reading.add(name);
    const c = kept ? rememberedChannel(ref, res, sink, kept, channels) : readChannel(ref, res, sink, channels);
    reading.delete(name);
    read.set(name, c);
    return c;
  };
  for (const ref of blocks.values()) {
    if (ref.kind !== 'channel' || ref.file !== entry.path) continue;
    const c = channels(ref.node.name.text);
    if (c && c !== 'cycle') res.channels.push(c);
  }
  return res;
}

/** A channel of the spec by name, read once: null when it has errors, 'cycle' while it is being read. */
type ChannelReader = (name: string) => ChannelDef | null | 'cycle';

/**
 * Every named block of the files by name, of every kind in the schema; the first definition of a
 * name wins (the entry file comes first, so a duplicate is reported where the user is typing).
 * Also what navigation reads (features/navigation.ts), so both agree on what a name means.
 */
export function declaredBlocks(files: readonly LoadedFile[], sink: DiagnosticSink = new DiagnosticSink()): Map<string, BlockRef> {
  const blocks = new Map<string, BlockRef>();
  for (const file of files) {
    for (const item of file.parse.tree.items) {
      if (item.kind !== 'block') continue;
      const spec = blockSpec(item.keyword.text);
      if (!spec) {
        const near = closest(item.keyword.text, blockKinds());
        sink.report('unknown-block', file.path, item.keyword.span, `unknown block kind '${shown(item.keyword.text)}'; expected ${blockKinds().join(', ')}${near ? ` (did you mean '${near}'?)` : ''}`);
        continue;
      }
      const prior = blocks.get(item.name.text);
      if (prior) {
        sink.report('duplicate-name', file.path, item.name.span, `'${shown(item.name.text)}' is already defined${prior.file === file.path ? '' : ` in ${prior.file}`}`);
        continue;
      }
      blocks.set(item.name.text, { kind: spec.kind, file: file.path, node: item });
    }
  }
  return blocks;
}

/**
 * Definitions read from a block before, with the diagnostics they gave, by the block's piece of
 * text (syntax/parse.ts pieceOrigin: the same base node for the same text). A keystroke re-reads
 * only the blocks it changed; a block that only moved gets a moved copy of what it gave before.
 * A sensor or ADC depends on its own block alone; a channel also on the sensor and ADC it names.
 */
export interface Remembered {
  file: string;
  /** Offset of the block's piece when `def` and `diagnostics` were made. */
  by: number;
  def: unknown;
  diagnostics: DiagnosticSink['items'];
}

/** Definitions by the first parse of their piece of text; a document's own (document-state.ts). */
export type KeptDefinitions = WeakMap<TopItem, Remembered>;

function recall(ref: BlockRef, sink: DiagnosticSink, kept: KeptDefinitions, accept: (hit: Remembered) => boolean, move: (hit: Remembered, by: number) => unknown): unknown | undefined {
  const { base, by } = pieceOrigin(ref.node);
  const hit = kept.get(base);
  if (!hit || hit.file !== ref.file || !accept(hit)) return undefined;
  if (hit.by !== by) {
    hit.def = move(hit, by - hit.by);
    hit.diagnostics = movedCopy(hit.diagnostics, by - hit.by);
    hit.by = by;
  }
  sink.items.push(...hit.diagnostics);
  return hit.def;
}

function remember<T>(ref: BlockRef, sink: DiagnosticSink, kept: KeptDefinitions, read: (into: DiagnosticSink) => T | null): T | null {
  const local = new DiagnosticSink();
  const def = read(local);
  sink.items.push(...local.items);
  const { base, by } = pieceOrigin(ref.node);
  kept.set(base, { file: ref.file, by, def, diagnostics: [...local.items] });
  return def;
}

function remembered<T>(ref: BlockRef, sink: DiagnosticSink, kept: KeptDefinitions | undefined, read: (into: DiagnosticSink) => T | null): T | null {
  if (!kept) return read(sink);
  const hit = recall(ref, sink, kept, () => true, (h, delta) => (h.def === null ? null : movedCopy(h.def as object, delta)));
  return hit === undefined ? remember(ref, sink, kept, read) : (hit as T | null);
}

/** A channel is kept while its block is the same text and the sensor and ADC it names have the same content. */
function rememberedChannel(ref: BlockRef, res: Resolution, sink: DiagnosticSink, kept: KeptDefinitions, channels: ChannelReader): ChannelDef | null {
  const sensorOf = (c: ChannelDef) => res.sensors.get(c.sensor.name);
  const adcOf = (c: ChannelDef) => res.adcs.get(c.adc.name);
  const linkedOf = (c: ChannelDef) => Object.fromEntries(Object.entries(c.linked ?? {}).map(([field, l]) => [field, channels(l.name)]));
  const same = (a: unknown, b: object) => typeof a === 'object' && a !== null && contentToken(a) === contentToken(b);
  const hit = recall(
    ref,
    sink,
    kept,
    (h) => {
      const c = h.def as ChannelDef | null;
      if (c === null || !same(sensorOf(c), c.sensor) || !same(adcOf(c), c.adc)) return false;
      const now = linkedOf(c);
      return Object.entries(c.linked ?? {}).every(([field, l]) => same(now[field], l));
    },
    (h, delta) => {
      // Its own spans move; the sensor, ADC and linked channels are set to their current definitions below.
      const c = h.def as ChannelDef;
      const moved: ChannelDef = { ...shiftOffsets({ ...c, sensor: null, adc: null, linked: undefined }, delta), sensor: c.sensor, adc: c.adc, ...(c.linked ? { linked: c.linked } : {}) };
      sameContent(moved, c);
      return moved;
    },
  ) as ChannelDef | undefined;
  if (hit === undefined) return remember(ref, sink, kept, (into) => readChannel(ref, res, into, channels));
  const sensor = sensorOf(hit)!;
  const adc = adcOf(hit)!;
  const linked = hit.linked ? (linkedOf(hit) as Record<string, ChannelDef>) : undefined;
  const linkedSame = !linked || Object.entries(linked).every(([field, l]) => hit.linked![field] === l);
  if (hit.sensor === sensor && hit.adc === adc && linkedSame) return hit;
  // The sensor, ADC or a linked channel moved: the same channel, pointing at their current definitions.
  const current: ChannelDef = { ...hit, sensor, adc, ...(linked ? { linked } : {}) };
  sameContent(current, hit);
  kept.get(pieceOrigin(ref.node).base)!.def = current;
  return current;
}

/**
 * A channel field naming another channel of the spec (sensors/kind.ts `readChannel`): that
 * channel, read first; null, reported at the name, when it is not a channel of this file, has
 * errors of its own, or leads back to the channel being read.
 */
function readChannelRef(r: BlockReader, field: string, res: Resolution, channels: ChannelReader): ChannelDef | null {
  const terms = r.terms(field);
  if (!terms) {
    r.missing(field);
    return null;
  }
  const t = terms[0]!;
  const fail = (code: 'bad-value' | 'unknown-name' | 'wrong-kind', message: string, span = spanOf(terms)) => {
    r.sink.report(code, r.ref.file, span, message);
    r.ok = false;
    return null;
  };
  if (t.kind !== 'word') return fail('bad-value', `${field} takes the name of another channel of this file`);
  if (!noExtra(terms, 1, r.ctx(field))) r.ok = false;
  const block = res.blocks.get(t.text);
  if (!block) {
    const pool = [...res.blocks.values()].filter((b) => b.kind === 'channel' && b.node !== r.ref.node).map((b) => b.node.name.text);
    const near = closest(t.text, pool);
    return fail('unknown-name', `no channel named '${shown(t.text)}' is defined${near ? ` (did you mean '${near}'?)` : pool.length ? `; defined: ${pool.join(', ')}` : ''}`, t.span);
  }
  if (block.kind !== 'channel') return fail('wrong-kind', `'${shown(t.text)}' is ${kindWithArticle(block.kind)}, but ${field} needs a channel`, t.span);
  if (block.node === r.ref.node) return fail('bad-value', `${field}: channel '${shown(t.text)}' cannot name itself (a cycle); name the channel that measures it`, t.span);
  if (block.file !== r.ref.file) return fail('bad-value', `${field}: channel '${shown(t.text)}' is in ${block.file}; name a channel of this file (only this file's channels are analysed)`, t.span);
  const c = channels(t.text);
  if (c === 'cycle') return fail('bad-value', `${field}: channel '${shown(t.text)}' leads back to '${shown(r.ref.node.name.text)}' through the channels it names (a cycle); name a channel that measures the temperature itself`, t.span);
  // The channel exists but has its own errors (reported there): skip this one quietly.
  if (!c) r.ok = false;
  return c;
}

function base(ref: BlockRef, r: BlockReader): DefBase {
  return {
    name: ref.node.name.text,
    file: ref.file,
    nameSpan: ref.node.name.span,
    span: ref.node.span,
    fieldSpans: r.fieldSpans,
    given: [...r.fields.keys()],
  };
}

function readAdc(ref: BlockRef, sink: DiagnosticSink): AdcDef | null {
  const r = new BlockReader(ref, blockSpec('adc')!, sink);
  const bits = r.quantity('bits');
  const reference = r.quantity('reference');
  const maxSource = r.terms('max_source') ? r.quantity('max_source') : null;
  const sampleCap = r.terms('sample_cap') ? r.quantity('sample_cap') : null;
  if (!r.ok || !bits || !reference) return null;
  // Error-budget fields (budget/read-spec.ts); a bad one drops the ADC like any other bad field.
  const extra = (name: string, read: (t: Term[]) => number | null): number | undefined => {
    const t = r.terms(name);
    if (!t) return undefined;
    const v = read(t);
    if (v === null) r.ok = false;
    return v ?? undefined;
  };
  const offsetLsb = extra('offset_error', (t) => readLsbBound(t, r.ctx('offset_error')));
  const gainError = extra('gain_error', (t) => readRelativeBound(t, r.ctx('gain_error')));
  const inlLsb = extra('inl', (t) => readLsbBound(t, r.ctx('inl')));
  const noise = extra('noise', (t) => readNoise(t, r.ctx('noise'), reference.value / 2 ** bits.value));
  if (!r.ok) return null;
  return {
    kind: 'adc', ...base(ref, r), bits: bits.value, reference, maxSourceOhms: maxSource?.value ?? null, sampleFarads: sampleCap?.value ?? null,
    offsetLsb: offsetLsb ?? 0, gainError: gainError ?? 0, inlLsb: inlLsb ?? 0, noiseLsbRms: noise ?? null,
  };
}

/** A field naming an adc definition. */
function readAdcRef(r: BlockReader, name: string, res: Resolution): AdcDef | null {
  const target = 'adc';
  const terms = r.terms(name);
  if (!terms) {
    r.missing(name);
    return null;
  }
  const t = terms[0]!;
  if (t.kind !== 'word') {
    r.sink.report('bad-value', r.ref.file, spanOf(terms), `${name} takes the name of an adc definition`);
    r.ok = false;
    return null;
  }
  if (!noExtra(terms, 1, r.ctx(name))) r.ok = false;
  const block = res.blocks.get(t.text);
  if (!block) {
    const pool = [...res.blocks.values()].filter((b) => b.kind === target).map((b) => b.node.name.text);
    const near = closest(t.text, pool);
    r.sink.report('unknown-name', r.ref.file, t.span, `no ${target} named '${shown(t.text)}' is defined${near ? ` (did you mean '${near}'?)` : pool.length ? `; defined: ${pool.join(', ')}` : ''}`);
    r.ok = false;
    return null;
  }
  if (block.kind !== target) {
    r.sink.report('wrong-kind', r.ref.file, t.span, `'${shown(t.text)}' is ${kindWithArticle(block.kind)}, but ${name} needs ${kindWithArticle(target)}`);
    r.ok = false;
    return null;
  }
  const def = res.adcs.get(t.text);
  // The definition exists but has its own errors (reported there): skip the channel quietly.
  if (!def) r.ok = false;
  return def ?? null;
}

/** `0.1 °C per count`, `10 counts per °C`: returns kelvin per count. */
function readResolution(r: BlockReader): number | null {
  const terms = r.terms('resolution');
  if (!terms) return null;
  const bad = () => r.refuse('resolution', terms, 'resolution takes `0.1 °C per count` or `10 counts per °C`');
  const [q, per, what] = terms;
  if (!q || q.kind !== 'quantity' || !per || per.kind !== 'word' || per.text !== 'per' || !what || (what.kind !== 'word' && what.kind !== 'unit')) return bad();
  if (!noExtra(terms, 3, r.ctx('resolution'))) return bad();
  const whatUnit = readUnit(what.text);
  if (typeof whatUnit === 'string') return bad();
  if (whatUnit.dimension === 'count') {
    const k = readPart(q, PART_DOMAINS.resolution, r.ctx('resolution'));
    return k === null ? ((r.ok = false), null) : k;
  }
  if (whatUnit.dimension === 'temperature') {
    const qUnit = q.unit ? readUnit(q.unit.text) : null;
    if (qUnit !== null && (typeof qUnit === 'string' || qUnit.dimension !== 'count')) return bad();
    const k = whatUnit.scale / q.number.value;
    const d = PART_DOMAINS.resolution;
    if (!(k >= d.min && k <= d.max)) {
      r.sink.report('out-of-domain', r.ref.file, q.span, `resolution must be from ${1 / d.max} to ${1 / d.min} counts per kelvin (found ${q.number.text} per ${what.text})`);
      return (r.ok = false), null;
    }
    return k;
  }
  return bad();
}

function readAccuracy(r: BlockReader): number | null {
  const terms = r.terms('accuracy');
  if (!terms) return null;
  const t = terms[0]!;
  const q = t.kind === 'tolerance' ? t.amount : t.kind === 'quantity' ? t : null;
  if (!q || !noExtra(terms, 1, r.ctx('accuracy'))) {
    r.sink.report('bad-value', r.ref.file, spanOf(terms), 'accuracy takes a temperature difference such as `± 0.5 °C`');
    r.ok = false;
    return null;
  }
  const k = readPart(q, PART_DOMAINS.accuracy, r.ctx('accuracy'));
  if (k === null) return (r.ok = false), null;
  return k;
}

/** Options of the generated conversion code; undefined when the channel gives none of them. */
function readCodegen(r: BlockReader): CodegenSpec | null | undefined {
  if (!['output', 'code_error', 'code_method', 'float_variant', 'optimise', 'code_prefix'].some((n) => r.terms(n))) return undefined;
  const unit = r.quantity('output', 0.01);
  const error = r.quantity('code_error', 0.02);
  const method = r.choice('code_method', 'auto') as CodegenSpec['method'];
  const floatVariant = r.choice('float_variant', 'no') === 'yes';
  const optimise = r.terms('optimise') ? (r.choice('optimise', 'balanced') as NonNullable<CodegenSpec['optimise']>) : undefined;
  const prefix = readCodePrefix(r);
  if (!unit || !error || prefix === null) return null;
  const at = (name: string) => r.fieldSpans[name] ?? r.ref.node.name.span;
  const scale = Math.round(1 / unit.value);
  if (!(scale >= 1 && scale <= 10000 && Math.abs(1 / unit.value - scale) <= 1e-6 * scale)) {
    r.sink.report('out-of-domain', r.ref.file, at('output'), `output must divide 1 °C into a whole number of units, 1 to 10000 (such as 0.01 °C or 0.05 °C); got ${trimNumber(unit.value, 6)} °C`);
    return null;
  }
  if (!(error.value >= 0.5 / scale && error.value <= 100)) {
    r.sink.report('out-of-domain', r.ref.file, at('code_error'), `code_error must be from half an output unit (${trimNumber(0.5 / scale, 6)} °C) to 100 °C; got ${trimNumber(error.value, 6)} °C`);
    return null;
  }
  return { outputScale: scale, errorC: error.value, method, floatVariant, ...(optimise ? { optimise } : {}), ...(prefix ? { prefix } : {}) };
}

/** `code_prefix = name`: undefined when absent, null (reported) when unusable. */
function readCodePrefix(r: BlockReader): string | null | undefined {
  const terms = r.terms('code_prefix');
  if (!terms) return undefined;
  const w = terms[0]!;
  if (w.kind === 'word' && !noExtra(terms, 1, r.ctx('code_prefix'))) return null;
  const problem = w.kind === 'word' ? prefixProblem(w.text) : 'must be a C identifier of 1 to 32 letters, digits and underscores starting with a letter';
  if (problem === undefined && w.kind === 'word') return w.text;
  r.sink.report('bad-value', r.ref.file, spanOf(terms), `code_prefix ${problem}, such as \`boiler_\``);
  return null;
}

function readChannel(ref: BlockRef, res: Resolution, sink: DiagnosticSink, channels: ChannelReader): ChannelDef | null {
  const r = new BlockReader(ref, blockSpec('channel')!, sink);
  const linked: Record<string, ChannelDef> = {};
  const channelRef = (field: string) => {
    const c = readChannelRef(r, field, res, channels);
    if (c) linked[field] = c;
    return c;
  };
  const sensor = readSensorRef(r, res);
  const adc = readAdcRef(r, 'adc', res);
  const biasTerms = r.terms('bias');
  const twin = isTwoCurrentBias(biasTerms) ? readTwoCurrentBias(biasTerms!, r.ctx('bias')) : undefined;
  if (twin === null) r.ok = false;
  const bias = twin === undefined ? readBias(r) : twin?.first ?? null;
  const range = r.range('range');
  const step = r.quantity('step', 1);
  const resolution = readResolution(r);
  const accuracy = readAccuracy(r);
  const codegen = readCodegen(r);
  if (codegen === null) r.ok = false;
  const conversion = r.choice('conversion', 'table') as 'table' | 'line';
  const window = r.range('current_window', [1e-6, 1e-3]);
  const theta = r.terms('theta_ja') ? r.quantity('theta_ja') : null;
  if (range && step && step.value > 0 && (range.high - range.low) / step.value > 100_000) {
    sink.report('out-of-domain', ref.file, r.fieldSpans['step'] ?? ref.node.name.span, `step gives ${Math.ceil((range.high - range.low) / step.value)} sweep points; at most 100000 are allowed (use a step of at least ${((range.high - range.low) / 100_000).toPrecision(2)} K)`);
    r.ok = false;
  }
  // Error-budget fields (budget/read-spec.ts).
  const phrase = <T>(name: string, read: (t: Term[]) => T | null): T | undefined => {
    const t = r.terms(name);
    if (!t) return undefined;
    const v = read(t);
    if (v === null) r.ok = false;
    return v ?? undefined;
  };
  const calibration = range ? phrase('calibration', (t) => readCalibration(t, r.ctx('calibration'), range.low, range.high)) : undefined;
  const measured = adc ? phrase('measured', (t) => readMeasured(t, r.ctx('measured'), adc.bits)) : undefined;
  const benchData = phrase('bench_data', (t) => readBenchRef(t, r.ctx('bench_data')));
  const calReference = phrase('cal_reference', (t) => readCalReference(t, r.ctx('cal_reference')));
  const monteCarlo = phrase('monte_carlo', (t) => readMonteCarlo(t, r.ctx('monte_carlo')));
  const oversampling = phrase('oversampling', (t) => readOversampling(t, r.ctx('oversampling')));
  const dynamics = readDynamics((n) => r.terms(n), (n) => r.ctx(n), (n) => r.quantity(n));
  if (dynamics === null) r.ok = false;
  // Resistive-sensor fields (read-sensors.ts).
  const extras = readChannelExtras(r, sensor, bias, adc, range, channelRef);
  if (twin && sensor && !kindOf(sensor).twoCurrent) {
    sink.report('bad-value', ref.file, r.fieldSpans['bias'] ?? ref.node.name.span, `the two-current bias is for ${kindsInWords(sensorKinds().filter((k) => k.twoCurrent))}; '${sensor.name}' is a ${sensor.kind}`);
    r.ok = false;
  }
  if (!r.ok || !sensor || !adc || !bias || !range || !step || !window) return null;
  return {
    ...extras,
    ...(Object.keys(linked).length ? { linked } : {}),
    ...(twin ? { secondBias: twin.second } : {}),
    ...(calibration ? { calibration } : {}),
    ...(measured ? { measured } : {}),
    ...(benchData ? { benchData } : {}),
    ...(monteCarlo ? { monteCarlo } : {}),
    ...(calReference !== undefined ? { calReferenceK: calReference } : {}),
    ...(oversampling !== undefined ? { oversamplingBits: oversampling } : {}),
    ...(dynamics ? { dynamics } : {}),
    ...(codegen ? { codegen } : {}),
    kind: 'channel',
    ...base(ref, r),
    sensor,
    adc,
    bias,
    lowK: range.low,
    highK: range.high,
    stepK: step.value,
    resolutionKPerCount: resolution,
    accuracyK: accuracy,
    thetaJA: theta?.value ?? sensor.thetaJA,
    conversion,
    windowLowA: window.low,
    windowHighA: window.high,
  };
}
