// Open documents and file access for the engine: a SourceHost that reads open documents first
// (so a `use`d file being edited is seen as typed), then the disk. Also maps URIs to paths and
// lists the workspace's specs (navigation reaches files that are not open).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { TextDocuments } from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { SourceHost } from '../engine';
import { isInside } from '../engine';
import { readDisk, realPathOnDisk } from '../disk';

export { readDisk };

/** Bounds of the workspace walk: folder depth, entries looked at, spec files kept. */
const SCAN_DEPTH = 12;
const SCAN_ENTRIES = 50_000;
const SCAN_FILES = 2_000;

export class OpenDocuments {
  readonly docs = new TextDocuments(TextDocument);
  /** Folders of the workspace (absolute paths); `use` may not leave the one holding a file. */
  roots: string[] = [];

  get(uri: string): TextDocument | undefined {
    return this.docs.get(uri);
  }

  /** The open document whose path is `absPath`, if any. */
  byPath(absPath: string): TextDocument | undefined {
    for (const d of this.docs.all()) if (uriToPath(d.uri, this.roots) === absPath) return d;
    return undefined;
  }

  /** Workspace root for a file: the innermost workspace folder holding it, else its own folder. */
  rootFor(absPath: string): string {
    let best: string | undefined;
    for (const r of this.roots) {
      if (isInside(r, absPath) && (!best || r.length > best.length)) best = r;
    }
    return best ?? path.dirname(absPath);
  }

  /**
   * Every spec of the workspace: the `.tsense` files under the workspace folders (a bounded walk
   * that skips node_modules, .git and other dot-folders and does not follow links), and every open
   * spec. Paths, each once; the text is read through `host()`.
   */
  workspaceSpecs(): string[] {
    const out = new Set<string>();
    let budget = SCAN_ENTRIES;
    const walk = (dir: string, depth: number): void => {
      if (depth > SCAN_DEPTH || budget <= 0 || out.size >= SCAN_FILES) return;
      let entries: fs.Dirent[];
      try {
        entries = fs.readdirSync(dir, { withFileTypes: true });
      } catch {
        return;
      }
      for (const e of entries) {
        if (--budget <= 0 || out.size >= SCAN_FILES) return;
        if (e.isDirectory()) {
          if (!e.name.startsWith('.') && e.name !== 'node_modules') walk(path.join(dir, e.name), depth + 1);
        } else if (e.isFile() && e.name.endsWith('.tsense')) out.add(path.join(dir, e.name));
      }
    };
    for (const r of this.roots) walk(r, 0);
    for (const d of this.docs.all()) if (d.languageId === 'tsense' || d.uri.endsWith('.tsense')) out.add(uriToPath(d.uri, this.roots));
    return [...out];
  }

  /** Reads open documents first, then the disk. */
  host(overrides?: Map<string, string>): SourceHost {
    return {
      read: (absPath: string) => {
        const o = overrides?.get(absPath);
        if (o !== undefined) return o;
        const open = this.byPath(absPath);
        if (open) return open.getText();
        return readDisk(absPath);
      },
      realPath: realPathOnDisk,
    };
  }
}

/** Absolute path for a URI; an unsaved buffer gets a path in the first workspace folder. */
export function uriToPath(uri: string, roots: string[] = []): string {
  if (uri.startsWith('file:')) {
    try {
      return path.resolve(fileURLToPath(uri));
    } catch {
      // fall through to the synthetic path
    }
  }
  const base = roots[0] ?? process.cwd();
  return path.join(base, `untitled-${uri.replace(/[^A-Za-z0-9_-]+/g, '_')}.tsense`);
}

export function pathToUri(absPath: string): string {
  return pathToFileURL(absPath).toString();
}
