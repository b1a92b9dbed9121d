// Loads a spec file and every file it brings in with `use`, through an injected reader.
// The engine does no IO of its own: the CLI reads from disk, the server from open documents.
import * as path from 'node:path';
import { parse, type ParseCache } from '../syntax/parse';
import type { ParseResult, UseNode } from '../syntax/ast';
import type { DiagnosticSink } from '../checks/diagnostic';

export interface SourceHost {
  /** Text of the file at an absolute path, or undefined when it cannot be read. */
  read(absPath: string): string | undefined;
}

export interface LoadedFile {
  path: string;
  text: string;
  parse: ParseResult;
  /** The `use` lines of this file and the absolute path each resolved to (null when refused). */
  uses: { node: UseNode; target: string | null }[];
}

/** Files in load order, the entry first. */
export function loadWorkspace(entry: string, entryText: string, root: string, host: SourceHost, sink: DiagnosticSink, parseCache?: ParseCache): LoadedFile[] {
  const files = new Map<string, LoadedFile>();
  const order: LoadedFile[] = [];
  const rootAbs = path.resolve(root);

  const visit = (file: string, text: string, stack: string[]): LoadedFile => {
    // Used files have caches of their own, so their unchanged blocks keep their definitions too.
    const parsed = parse(text, stack.length === 1 ? parseCache : parseCache?.forUsedFile(file));
    const loaded: LoadedFile = { path: file, text, parse: parsed, uses: [] };
    files.set(file, loaded);
    order.push(loaded);
    for (const p of parsed.problems) sink.report('syntax', file, p.span, p.message);
    for (const item of parsed.tree.items) {
      if (item.kind !== 'use') continue;
      const target = path.resolve(path.dirname(file), item.path.text);
      const rel = path.relative(rootAbs, target);
      if (item.path.text === '' ) {
        sink.report('import-missing', file, item.path.span, 'use needs a file path, e.g. use "parts.tsense"');
        loaded.uses.push({ node: item, target: null });
        continue;
      }
      if (rel.startsWith('..') || path.isAbsolute(rel)) {
        sink.report('import-outside-root', file, item.path.span, `'${item.path.text}' leaves the workspace root (the folder '${path.basename(rootAbs)}'); keep used files inside it`);
        loaded.uses.push({ node: item, target: null });
        continue;
      }
      if (stack.includes(target)) {
        const chain = [...stack.slice(stack.indexOf(target)), target].map((f) => path.relative(rootAbs, f) || f).join(' -> ');
        sink.report('import-cycle', file, item.path.span, `files use each other in a cycle: ${chain}`);
        loaded.uses.push({ node: item, target: null });
        continue;
      }
      loaded.uses.push({ node: item, target });
      if (files.has(target)) continue;
      const child = host.read(target);
      if (child === undefined) {
        sink.report('import-missing', file, item.path.span, `cannot read '${item.path.text}' (looked for ${path.relative(rootAbs, target)} in the folder '${path.basename(rootAbs)}')`);
        continue;
      }
      visit(target, child, [...stack, target]);
    }
    return loaded;
  };

  visit(path.resolve(entry), entryText, [path.resolve(entry)]);
  return order;
}
