// The CLI's file access: the engine's SourceHost over the disk, and line indexes for output.
import { readDisk, realPathOnDisk } from '../disk';
import type { SourceHost } from '../engine';
import { LineIndex } from '../engine';

export class DiskHost implements SourceHost {
  private readonly cache = new Map<string, string | undefined>();
  private readonly reals = new Map<string, string>();
  private readonly indexes = new Map<string, LineIndex>();
  read(absPath: string): string | undefined {
    if (!this.cache.has(absPath)) this.cache.set(absPath, readDisk(absPath));
    return this.cache.get(absPath);
  }
  realPath(absPath: string): string {
    let r = this.reals.get(absPath);
    if (r === undefined) this.reals.set(absPath, (r = realPathOnDisk(absPath)));
    return r;
  }
  /** Line index of a file that has been read (empty text when it has not); one per file, kept. */
  index(absPath: string): LineIndex {
    let ix = this.indexes.get(absPath);
    if (!ix) this.indexes.set(absPath, (ix = new LineIndex(this.read(absPath) ?? '')));
    return ix;
  }
}

export interface CliIO {
  out(text: string): void;
  err(text: string): void;
  cwd: string;
}

export const EXIT = { clean: 0, errors: 1, unusable: 2 } as const;
