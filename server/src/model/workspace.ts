// Loads a spec file and every file it brings in with `use`, through an injected reader.
// The engine does no IO of its own: the CLI reads from disk, the server from open documents.
// Files are identified by their real path (links resolved, given by the host): a link inside the
// root that leads out of it is refused, and two links to one folder cannot make one file look like
// ever new files. The walk keeps its own stack, so a long chain of used files cannot overflow.
import * as path from 'node:path';
import { parse, type ParseCache } from '../syntax/parse';
import type { ParseResult, SyntaxProblem, UseNode } from '../syntax/ast';
import type { DiagnosticSink } from '../diagnostics/diagnostic';
import { shown } from '../diagnostics/shown';

export interface SourceHost {
  /** Text of the file at an absolute path, or undefined when it cannot be read. */
  read(absPath: string): string | undefined;
  /**
   * The real path of an absolute path (symbolic links resolved); for a file that does not exist,
   * its real folder joined with its name. Hosts without links (tests, memory) may leave it out.
   */
  realPath?(absPath: string): string;
}

export interface LoadedFile {
  path: string;
  text: string;
  parse: ParseResult;
  /** The `use` lines of this file and the absolute path each resolved to (null when refused). */
  uses: { node: UseNode; target: string | null }[];
}

/** Whether `target` is `root` or lies below it, compared by path segments (`..foo` is a name). */
export function isInside(root: string, target: string): boolean {
  const rel = path.relative(root, target);
  return rel === '' || (rel !== '..' && !rel.startsWith('..' + path.sep) && !path.isAbsolute(rel));
}

/** A chain of files for a message: the first three and the last two when it is long. */
function chainText(files: string[], rootAbs: string): string {
  const names = files.map((f) => shown(path.relative(rootAbs, f) || f));
  return (names.length > 6 ? [...names.slice(0, 3), `… ${names.length - 5} more …`, ...names.slice(-2)] : names).join(' -> ');
}

interface Frame {
  loaded: LoadedFile;
  real: string;
  next: number;
}

/** A file's syntax problems as diagnostics (also what the language server publishes first on a large open). */
export function reportSyntax(file: string, problems: readonly SyntaxProblem[], sink: DiagnosticSink): void {
  for (const p of problems) sink.report('syntax', file, p.span, p.message);
}

/** Files in load order, the entry first. */
export function loadWorkspace(entry: string, entryText: string, root: string, host: SourceHost, sink: DiagnosticSink, parseCache?: ParseCache): LoadedFile[] {
  const byReal = new Map<string, LoadedFile>();
  const order: LoadedFile[] = [];
  const rootAbs = path.resolve(root);
  const real = (p: string) => host.realPath?.(p) ?? p;
  const realRoot = real(rootAbs);
  const rootName = shown(path.basename(rootAbs));

  const open = (file: string, realFile: string, text: string, isEntry: boolean): Frame => {
    // Used files have caches of their own, so their unchanged blocks keep their definitions too.
    const parsed = parse(text, isEntry ? parseCache : parseCache?.forUsedFile(file));
    const loaded: LoadedFile = { path: file, text, parse: parsed, uses: [] };
    byReal.set(realFile, loaded);
    order.push(loaded);
    reportSyntax(file, parsed.problems, sink);
    return { loaded, real: realFile, next: 0 };
  };

  const entryAbs = path.resolve(entry);
  const stack: Frame[] = [open(entryAbs, real(entryAbs), entryText, true)];
  const onStack = new Set<string>([stack[0]!.real]);
  while (stack.length > 0) {
    const top = stack[stack.length - 1]!;
    const { loaded } = top;
    const items = loaded.parse.tree.items;
    let item: UseNode | undefined;
    while (top.next < items.length && !item) {
      const it = items[top.next++]!;
      if (it.kind === 'use') item = it;
    }
    if (!item) {
      stack.pop();
      onStack.delete(top.real);
      continue;
    }
    const file = loaded.path;
    const written = shown(item.path.text);
    const refuse = () => loaded.uses.push({ node: item, target: null });
    if (item.path.text === '') {
      sink.report('import-missing', file, item.path.span, 'use needs a file path, e.g. use "parts.tsense"');
      refuse();
      continue;
    }
    const target = path.resolve(path.dirname(file), item.path.text);
    if (!isInside(rootAbs, target)) {
      sink.report('import-outside-root', file, item.path.span, `'${written}' leaves the workspace root (the folder '${rootName}'); keep used files inside it`);
      refuse();
      continue;
    }
    const realTarget = real(target);
    if (!isInside(realRoot, realTarget)) {
      sink.report('import-outside-root', file, item.path.span, `'${written}' leads through a symbolic link out of the workspace root (the folder '${rootName}'); keep used files inside it`);
      refuse();
      continue;
    }
    if (onStack.has(realTarget)) {
      const reals = stack.map((f) => f.real);
      const from = reals.indexOf(realTarget);
      const chain = chainText([...stack.slice(from).map((f) => f.loaded.path), target], rootAbs);
      sink.report('import-cycle', file, item.path.span, `files use each other in a cycle: ${chain}`);
      refuse();
      continue;
    }
    const known = byReal.get(realTarget);
    if (known) {
      loaded.uses.push({ node: item, target: known.path });
      continue;
    }
    loaded.uses.push({ node: item, target });
    const child = host.read(target);
    if (child === undefined) {
      const looked = path.relative(rootAbs, target);
      sink.report(
        'import-missing',
        file,
        item.path.span,
        looked === ''
          ? `cannot read '${written}': it names the workspace root folder '${rootName}' itself; name a .tsense file inside it`
          : `cannot read '${written}' (looked for '${shown(looked)}' in the folder '${rootName}')`,
      );
      continue;
    }
    stack.push(open(target, realTarget, child, false));
    onStack.add(realTarget);
  }
  return order;
}
