// Go to definition, find references and rename for every named block of every kind in the schema
// (a definition's name, or a field whose form is a reference to blocks of some kinds), across a spec
// and the files it uses, and across the other specs of a workspace. Offsets in, {file, span} out.
// Nothing here names a block kind: kinds and reference fields come from model/schema.ts.
import * as path from 'node:path';
import type { Span } from '../syntax/ast';
import type { ParseCache } from '../syntax/parse';
import { blockKinds, blockSpec, fieldSpec, type BlockKind } from '../model/schema';
import { declaredBlocks } from '../model/resolve';
import { type BlockRef } from '../model/block-reader';
import { loadWorkspace, type LoadedFile, type SourceHost } from '../model/workspace';
import { DiagnosticSink } from '../diagnostics/diagnostic';
import { locate } from './locate';

export interface FileSpan {
  file: string;
  span: Span;
}

/**
 * What navigation needs of a spec: its files (the entry first) and what each name means there.
 * An analysis has this shape; `loadNames` makes one without the analysis (for specs not open).
 */
export interface NamedSpec {
  path: string;
  files: readonly LoadedFile[];
  model: { blocks: ReadonlyMap<string, BlockRef> };
}

/** A spec's files and names only: parse and `use`, no model, sweep or check. */
export function loadNames(entry: string, text: string, root: string, host: SourceHost, parseCache?: ParseCache): NamedSpec {
  const files = loadWorkspace(path.resolve(entry), text, root, host, new DiagnosticSink(), parseCache);
  return { path: path.resolve(entry), files, model: { blocks: declaredBlocks(files) } };
}

export interface NamedSymbol {
  name: string;
  /** The kinds the name may have here: the definition's kind, or every kind the field accepts. */
  kinds: BlockKind[];
  /** Where the name is written under the cursor. */
  span: Span;
  /** The definition, when there is one. */
  definition: (FileSpan & { kind: BlockKind }) | null;
}

/** The definition name or reference under the cursor. */
export function symbolAt(a: NamedSpec, offset: number): NamedSymbol | null {
  const tree = a.files[0]?.parse.tree;
  const at = tree ? locate(tree, offset) : null;
  if (!at) return null;
  if (at.kind === 'block-name') {
    const kind = blockSpec(at.block.keyword.text)?.kind;
    if (!kind) return null;
    const ref = a.model.blocks.get(at.block.name.text);
    // A duplicate definition is its own target (the first one wins elsewhere).
    const definition = ref && ref.node === at.block ? { file: ref.file, span: ref.node.name.span, kind } : { file: a.path, span: at.block.name.span, kind };
    return { name: at.block.name.text, kinds: [kind], span: at.block.name.span, definition };
  }
  if (at.kind === 'term' && at.term.kind === 'word') {
    const accepts = refTargets(at.block.keyword.text, at.field.key.text);
    if (!accepts.length) return null;
    const ref = a.model.blocks.get(at.term.text);
    if (ref && accepts.includes(ref.kind)) return { name: at.term.text, kinds: [ref.kind], span: at.term.span, definition: { file: ref.file, span: ref.node.name.span, kind: ref.kind } };
    return { name: at.term.text, kinds: accepts, span: at.term.span, definition: null };
  }
  return null;
}

/** The block kinds a field of a block refers to (a channel's sensor: junction, thermistor or rtd), if any. */
function refTargets(blockKeyword: string, key: string): BlockKind[] {
  const spec = blockSpec(blockKeyword);
  const form = spec ? fieldSpec(spec, key)?.form : undefined;
  return form?.form === 'ref' ? (form.targets ?? [form.target]) : [];
}

/** Definition of the name under the cursor, or the file a `use` line brings in. */
export function definition(a: NamedSpec, offset: number): FileSpan | null {
  const tree = a.files[0]?.parse.tree;
  const at = tree ? locate(tree, offset) : null;
  if (at?.kind === 'use') {
    const u = a.files[0]!.uses.find((x) => x.node === at.node);
    return u?.target && a.files.some((f) => f.path === u.target) ? { file: u.target, span: { start: 0, end: 0 } } : null;
  }
  const d = symbolAt(a, offset)?.definition;
  return d ? { file: d.file, span: d.span } : null;
}

/** Every place in the spec's files where a definition of one of these kinds and this name is named. */
export function occurrences(a: NamedSpec, name: string, kinds: readonly BlockKind[], includeDefinition = true): FileSpan[] {
  const out: FileSpan[] = [];
  for (const file of a.files) {
    for (const item of file.parse.tree.items) {
      if (item.kind !== 'block') continue;
      const spec = blockSpec(item.keyword.text);
      if (!spec) continue;
      if (includeDefinition && kinds.includes(spec.kind) && item.name.text === name) out.push({ file: file.path, span: item.name.span });
      for (const f of item.fields) {
        if (f.kind !== 'field') continue;
        const t = f.value[0];
        if (t?.kind === 'word' && t.text === name && refTargets(item.keyword.text, f.key.text).some((k) => kinds.includes(k))) out.push({ file: file.path, span: t.span });
      }
    }
  }
  return out;
}

/** Does `other` see the same definition (its files hold it, and the name means it there)? */
function seesDefinition(other: NamedSpec, s: NamedSymbol): boolean {
  const d = s.definition;
  if (!d) return false;
  const ref = other.model.blocks.get(s.name);
  return ref !== undefined && ref.file === d.file && ref.node.name.span.start === d.span.start;
}

/**
 * Occurrences of the symbol under the cursor in `a` and in every other spec that sees its
 * definition (`others`: the workspace's specs, open or not), each place once. `text` of each
 * place's file is given for converting offsets.
 */
export function workspaceOccurrences(a: NamedSpec, offset: number, others: Iterable<NamedSpec>, includeDefinition: boolean): (FileSpan & { text: string })[] | null {
  const s = symbolAt(a, offset);
  if (!s) return null;
  const out: (FileSpan & { text: string })[] = [];
  const seen = new Set<string>();
  const add = (spec: NamedSpec) => {
    for (const o of occurrences(spec, s.name, s.kinds, includeDefinition)) {
      const key = `${o.file}\u0000${o.span.start}`;
      if (seen.has(key)) continue;
      seen.add(key);
      out.push({ ...o, text: spec.files.find((f) => f.path === o.file)!.text });
    }
  };
  add(a);
  if (s.definition) for (const other of others) if (other.path !== a.path && seesDefinition(other, s)) add(other);
  return out;
}

export function references(a: NamedSpec, offset: number, includeDefinition: boolean): FileSpan[] {
  return (workspaceOccurrences(a, offset, [], includeDefinition) ?? []).map(({ file, span }) => ({ file, span }));
}

export type RenameCheck = { ok: true; span: Span; placeholder: string } | { ok: false; message: string };

const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;
/** Words that start a block or a bias; a definition named so would read ambiguously. */
let reserved: Set<string> | undefined;
const RESERVED = () => (reserved ??= new Set(['use', ...blockKinds(), 'resistor', 'current', 'from', 'per']));

/** `a or b`, `a, b or c`. */
function either(kinds: readonly string[]): string {
  return kinds.length < 2 ? (kinds[0] ?? '') : `${kinds.slice(0, -1).join(', ')} or ${kinds[kinds.length - 1]}`;
}

export function prepareRename(a: NamedSpec, offset: number): RenameCheck {
  const s = symbolAt(a, offset);
  if (!s) return { ok: false, message: `Only the name of a ${either(blockKinds())} can be renamed.` };
  const refusal = s.definition ? blockSpec(s.definition.kind)?.notRenamed : undefined;
  if (refusal) return { ok: false, message: refusal };
  if (!s.definition) return { ok: false, message: `No ${either(s.kinds)} named '${s.name}' is defined, so there is nothing to rename.` };
  return { ok: true, span: s.span, placeholder: s.name };
}

export type RenameResult = { ok: true; edits: (FileSpan & { newText: string; text: string })[] } | { ok: false; message: string };

/**
 * Renames the symbol under the cursor in `a` and in every spec of `others` that sees its
 * definition. Refused when the new name is already defined in any of them, so that no file is
 * left with a duplicate or a dangling name.
 */
export function rename(a: NamedSpec, offset: number, newName: string, others: Iterable<NamedSpec> = []): RenameResult {
  const check = prepareRename(a, offset);
  if (!check.ok) return check;
  const s = symbolAt(a, offset)!;
  if (!IDENTIFIER.test(newName)) {
    return { ok: false, message: `'${newName}' is not a valid name: use letters, digits and _, starting with a letter or _ (e.g. small_npn).` };
  }
  if (RESERVED().has(newName)) return { ok: false, message: `'${newName}' is a word of the spec language; choose another name.` };
  const affected = [a, ...[...others].filter((o) => o.path !== a.path && seesDefinition(o, s))];
  if (newName !== s.name) {
    for (const spec of affected) {
      const taken = spec.model.blocks.get(newName);
      if (taken) return { ok: false, message: `'${newName}' is already defined${spec === a && taken.file === a.path ? '' : ` in ${path.basename(taken.file)}`}; choose a name not yet used.` };
    }
  }
  const edits = workspaceOccurrences(a, offset, affected.slice(1), true) ?? [];
  return { ok: true, edits: edits.map((o) => ({ ...o, newText: newName })) };
}
