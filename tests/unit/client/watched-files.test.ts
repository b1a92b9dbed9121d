// Every kind of file the server reads from the disk without the editor syncing it has a pattern in
// the extension's file watcher (client/src/watched-files.ts), so a change made by a checkout or
// another program reaches the server (LSP 3.17 workspace/didChangeWatchedFiles): a `use`d spec, a
// bench CSV (`bench_data`) and a generated C file. tests/protocol/disk-changes.test.ts checks what
// the server does with the notice. A fact of this design (common practice, no source).
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { WATCHED } from '../../../client/src/watched-files';

/** The few glob forms the patterns use: `**` + `/` + a name pattern with `*` and one `{a,b}`. */
function matches(glob: string, file: string): boolean {
  const name = glob.replace(/^\*\*\//, '');
  const alternatives = /\{([^}]*)\}/.exec(name);
  const forms = alternatives ? alternatives[1]!.split(',').map((a) => name.replace(alternatives[0], a)) : [name];
  const base = path.basename(file);
  return forms.some((f) => new RegExp(`^${f.split('*').map((p) => p.replace(/[.+?^${}()|[\]\\]/g, '\\$&')).join('.*')}$`).test(base));
}

describe('watched files', () => {
  it.each(['specs/parts.tsense', 'bench/run-3.csv', 'bench/RUN.CSV', 'fw/rig_conversion.c'])('%s is watched', (file) => {
    expect(WATCHED.some((g) => matches(g, file))).toBe(true);
  });

  it('other files are not', () => {
    expect(WATCHED.some((g) => matches(g, 'fw/main.c'))).toBe(false);
  });
});
