// What reads one block: its fields by canonical name (unknown and repeated ones reported) and typed
// reads of each form, with precise diagnostics. The resolver (resolve.ts) makes one per block; each
// sensor kind's `read` receives it (sensors/kind.ts).
import type { BlockNode, FieldNode, Span, Term } from '../syntax/ast';
import type { DiagnosticSink } from '../diagnostics/diagnostic';
import { fieldSpec, type BlockKind, type BlockSpec, type FieldSpec } from './schema';
import type { AdcDef, ChannelDef, SensorDef, Toleranced } from './types';
import { askForRest, noExtra, readQuantityField, readRange, spanOf, type ReadContext } from './read-value';
import { closest } from './suggest';
import { askForValue } from './language';
import { shown } from '../diagnostics/shown';

export interface BlockRef {
  kind: BlockKind;
  file: string;
  node: BlockNode;
}

export interface Resolution {
  blocks: Map<string, BlockRef>;
  /** Sensor definitions of every kind, by name (each read by its kind, sensors/<kind>/). */
  sensors: Map<string, SensorDef>;
  adcs: Map<string, AdcDef>;
  channels: ChannelDef[];
}

/**
 * Fields of a block by canonical name; reports unknown and repeated fields, and a field with no
 * value (`conversion =`) with the forms it takes; such a field is named in `empty`, not in the map.
 */
function fieldsOf(ref: BlockRef, spec: BlockSpec, sink: DiagnosticSink, empty: Set<string>): Map<string, { spec: FieldSpec; node: FieldNode }> {
  const out = new Map<string, { spec: FieldSpec; node: FieldNode }>();
  for (const f of ref.node.fields) {
    if (f.kind !== 'field') continue;
    const fs = fieldSpec(spec, f.key.text);
    if (!fs) {
      const near = closest(f.key.text, spec.fields.map((x) => x.name));
      sink.report('unknown-field', ref.file, f.key.span, `${spec.kind} has no field '${shown(f.key.text)}'${near ? ` (did you mean '${near}'?)` : `; its fields are ${spec.fields.map((x) => x.name).join(', ')}`}`);
      continue;
    }
    if (out.has(fs.name) || empty.has(fs.name)) {
      sink.report('duplicate-field', ref.file, f.key.span, `'${fs.name}' is already given in this ${spec.kind}; this one is ignored`);
      continue;
    }
    if (f.value.length === 0) {
      sink.report('bad-value', ref.file, f.span, askForValue(fs));
      empty.add(fs.name);
      continue;
    }
    out.set(fs.name, { spec: fs, node: f });
  }
  return out;
}

export class BlockReader {
  readonly fields: Map<string, { spec: FieldSpec; node: FieldNode }>;
  readonly fieldSpans: Record<string, Span> = {};
  /** Fields written with no value (already reported; the block is not usable). */
  readonly empty = new Set<string>();
  ok = true;
  constructor(readonly ref: BlockRef, readonly spec: BlockSpec, readonly sink: DiagnosticSink) {
    this.fields = fieldsOf(ref, spec, sink, this.empty);
    if (this.empty.size > 0) this.ok = false;
    for (const [name, f] of this.fields) this.fieldSpans[name] = spanOf(f.node.value);
  }
  ctx(name: string): ReadContext {
    return { file: this.ref.file, sink: this.sink, field: name };
  }
  terms(name: string): Term[] | undefined {
    return this.fields.get(name)?.node.value;
  }
  /** Refuses a field's value (not ok): a half-typed phrase is asked for what it lacks, anything else gets `message`. */
  refuse(name: string, terms: Term[], message: string): null {
    this.ok = false;
    if (!askForRest(terms, this.ctx(name))) this.sink.report('bad-value', this.ref.file, spanOf(terms), message);
    return null;
  }
  missing(name: string): void {
    this.ok = false;
    if (this.empty.has(name)) return; // written without a value: asked for it already
    const fs = fieldSpec(this.spec, name)!;
    this.sink.report('missing-field', this.ref.file, this.ref.node.name.span, `${this.spec.kind} '${shown(this.ref.node.name.text)}' needs '${name}', e.g. \`${fs.example}\``);
    this.ok = false;
  }
  /** A quantity field in base units, its default when absent, or null (and not ok) when bad. */
  quantity(name: string, fallback?: number): Toleranced | null {
    const fs = fieldSpec(this.spec, name)!;
    const terms = this.terms(name);
    if (!terms) {
      if (fallback === undefined) {
        this.missing(name);
        return null;
      }
      return { value: fallback, tolerance: 0, span: this.ref.node.name.span };
    }
    if (fs.form.form !== 'quantity') throw new Error(`field ${name} is not a quantity`);
    const q = readQuantityField(terms, fs.form, this.ctx(name));
    if (!q) this.ok = false;
    return q;
  }
  choice(name: string, fallback: string): string {
    const fs = fieldSpec(this.spec, name)!;
    const terms = this.terms(name);
    if (!terms || fs.form.form !== 'choice') return fallback;
    const t = terms[0]!;
    const options = fs.form.options;
    if (t.kind !== 'word' || !options.includes(t.text)) {
      this.sink.report('bad-value', this.ref.file, spanOf(terms), `${name} is one of ${options.join(', ')}`);
      this.ok = false;
      return fallback;
    }
    if (!noExtra(terms, 1, this.ctx(name))) this.ok = false;
    return t.text;
  }
  range(name: string, fallback?: [number, number]): { low: number; high: number } | null {
    const fs = fieldSpec(this.spec, name)!;
    const terms = this.terms(name);
    if (!terms) {
      if (!fallback) {
        this.missing(name);
        return null;
      }
      return { low: fallback[0], high: fallback[1] };
    }
    if (fs.form.form !== 'range') throw new Error(`field ${name} is not a range`);
    const r = readRange(terms, fs.form.dimension, this.ctx(name));
    if (!r) this.ok = false;
    return r;
  }
}
