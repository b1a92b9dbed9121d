// Disk access shared by the CLI's and the server's SourceHost (cli/io.ts, lsp/documents.ts).
// The engine never imports this file: it reads through the host it is given.
import * as fs from 'node:fs';
import * as path from 'node:path';

/** Text of a regular file (links followed), or undefined when it cannot be read. */
export function readDisk(absPath: string): string | undefined {
  try {
    return fs.statSync(absPath).isFile() ? fs.readFileSync(absPath, 'utf8') : undefined;
  } catch {
    return undefined;
  }
}

/**
 * Real path (every symbolic link resolved) of an absolute path; for a path that does not exist,
 * the real path of its nearest existing folder joined with the rest, so a link to a folder outside
 * is still seen for a file that is not there.
 */
export function realPathOnDisk(absPath: string): string {
  const rest: string[] = [];
  let p = path.resolve(absPath);
  for (;;) {
    try {
      return path.join(fs.realpathSync.native(p), ...rest);
    } catch {
      const parent = path.dirname(p);
      if (parent === p) return path.resolve(absPath);
      rest.unshift(path.basename(p));
      p = parent;
    }
  }
}
