// Go to definition, find references and rename for junction and ADC names (and definitions of
// channels), across the entry file and every file it uses. Offsets in, {file, span} out.
import type { Analysis } from '../engine';
import type { Span } from '../syntax/ast';
import { blockKinds, blockSpec, fieldSpec, type BlockKind } from '../model/schema';
import { locate } from './locate';

export interface FileSpan {
  file: string;
  span: Span;
}

export interface NamedSymbol {
  name: string;
  kind: BlockKind;
  /** Where the name is written under the cursor. */
  span: Span;
  /** The definition, when there is one. */
  definition: FileSpan | null;
}

/** The definition name or reference under the cursor. */
export function symbolAt(a: Analysis, offset: number): NamedSymbol | null {
  const tree = a.files[0]?.parse.tree;
  const at = tree ? locate(tree, offset) : null;
  if (!at) return null;
  if (at.kind === 'block-name') {
    const kind = blockSpec(at.block.keyword.text)?.kind;
    if (!kind) return null;
    const ref = a.model.blocks.get(at.block.name.text);
    const definition = ref && ref.node === at.block ? { file: ref.file, span: ref.node.name.span } : { file: a.path, span: at.block.name.span };
    return { name: at.block.name.text, kind, span: at.block.name.span, definition };
  }
  if (at.kind === 'term' && at.term.kind === 'word') {
    const target = refTarget(at.block.keyword.text, at.field.key.text);
    if (!target) return null;
    const ref = a.model.blocks.get(at.term.text);
    const definition = ref && ref.kind === target ? { file: ref.file, span: ref.node.name.span } : null;
    return { name: at.term.text, kind: target, span: at.term.span, definition };
  }
  return null;
}

/** The block kind a field of a block refers to (sensor -> junction, adc -> adc), if any. */
function refTarget(blockKeyword: string, key: string): BlockKind | null {
  const spec = blockSpec(blockKeyword);
  const form = spec ? fieldSpec(spec, key)?.form : undefined;
  return form?.form === 'ref' ? form.target : null;
}

/** Definition of the name under the cursor, or the file a `use` line brings in. */
export function definition(a: Analysis, offset: number): FileSpan | null {
  const tree = a.files[0]?.parse.tree;
  const at = tree ? locate(tree, offset) : null;
  if (at?.kind === 'use') {
    const u = a.files[0]!.uses.find((x) => x.node === at.node);
    return u?.target && a.files.some((f) => f.path === u.target) ? { file: u.target, span: { start: 0, end: 0 } } : null;
  }
  return symbolAt(a, offset)?.definition ?? null;
}

/** Every place in the analysis' files where a definition of this kind and name is named. */
export function occurrences(a: Analysis, name: string, kind: BlockKind, includeDefinition = true): FileSpan[] {
  const out: FileSpan[] = [];
  for (const file of a.files) {
    for (const item of file.parse.tree.items) {
      if (item.kind !== 'block') continue;
      const spec = blockSpec(item.keyword.text);
      if (!spec) continue;
      if (includeDefinition && spec.kind === kind && item.name.text === name) out.push({ file: file.path, span: item.name.span });
      for (const f of item.fields) {
        if (f.kind !== 'field' || refTarget(item.keyword.text, f.key.text) !== kind) continue;
        const t = f.value[0];
        if (t?.kind === 'word' && t.text === name) out.push({ file: file.path, span: t.span });
      }
    }
  }
  return out;
}

export function references(a: Analysis, offset: number, includeDefinition: boolean): FileSpan[] {
  const s = symbolAt(a, offset);
  return s ? occurrences(a, s.name, s.kind, includeDefinition) : [];
}

export type RenameCheck = { ok: true; span: Span; placeholder: string } | { ok: false; message: string };

const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;
/** Words that start a block or a bias; a definition named so would read ambiguously. */
let reserved: Set<string> | undefined;
const RESERVED = () => (reserved ??= new Set(['use', ...blockKinds(), 'resistor', 'current', 'from', 'per']));

export function prepareRename(a: Analysis, offset: number): RenameCheck {
  const s = symbolAt(a, offset);
  if (!s) return { ok: false, message: 'Only the name of a junction or an adc can be renamed.' };
  if (s.kind === 'channel') return { ok: false, message: 'Channel names are not renamed here: generated code and logs refer to them. Edit the name directly.' };
  if (!s.definition) return { ok: false, message: `No ${s.kind} named '${s.name}' is defined, so there is nothing to rename.` };
  return { ok: true, span: s.span, placeholder: s.name };
}

export type RenameResult = { ok: true; edits: (FileSpan & { newText: string })[] } | { ok: false; message: string };

export function rename(a: Analysis, offset: number, newName: string): RenameResult {
  const check = prepareRename(a, offset);
  if (!check.ok) return check;
  const s = symbolAt(a, offset)!;
  if (!IDENTIFIER.test(newName)) {
    return { ok: false, message: `'${newName}' is not a valid name: use letters, digits and _, starting with a letter or _ (e.g. small_npn).` };
  }
  if (RESERVED().has(newName)) return { ok: false, message: `'${newName}' is a word of the spec language; choose another name.` };
  if (newName !== s.name && a.model.blocks.has(newName)) return { ok: false, message: `'${newName}' is already defined; choose a name not yet used.` };
  return { ok: true, edits: occurrences(a, s.name, s.kind).map((o) => ({ ...o, newText: newName })) };
}
