// The CLI's file access: the engine's SourceHost over the disk, and line indexes for output.
import * as fs from 'node:fs';
import type { SourceHost } from '../model/workspace';
import { LineIndex } from '../syntax/line-index';

export class DiskHost implements SourceHost {
  private readonly cache = new Map<string, string | undefined>();
  read(absPath: string): string | undefined {
    if (!this.cache.has(absPath)) {
      let text: string | undefined;
      try {
        text = fs.statSync(absPath).isFile() ? fs.readFileSync(absPath, 'utf8') : undefined;
      } catch {
        text = undefined;
      }
      this.cache.set(absPath, text);
    }
    return this.cache.get(absPath);
  }
  /** Line index of a file that has been read (empty text when it has not). */
  index(absPath: string): LineIndex {
    return new LineIndex(this.read(absPath) ?? '');
  }
}

export interface CliIO {
  out(text: string): void;
  err(text: string): void;
  cwd: string;
}

export const EXIT = { clean: 0, errors: 1, unusable: 2 } as const;
