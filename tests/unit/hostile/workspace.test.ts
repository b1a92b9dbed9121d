// Issue #17, hostile `use` layouts and broken files: each case names its item and asserts the
// outcome (a diagnostic with its code, never an escape, a hang or a crash).
import * as path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { OpenDocuments } from '../../../server/src/lsp/documents';
import { CHANNEL, Layout, PARTS } from '../../fixtures/hostile/layout';

let layout: Layout | undefined;
afterEach(() => {
  layout?.dispose();
  layout = undefined;
});
const make = (entries: ConstructorParameters<typeof Layout>[0]) => (layout = new Layout(entries));
const codes = (r: { out: string }) => [...r.out.matchAll(/\[([a-z-]+)\]/g)].map((m) => m[1]);

describe('issue #17: use and symbolic links', () => {
  it('item 2: a link inside the root to a file outside is refused (import-outside-root), and nothing of it is read', () => {
    const l = make({ 'outside/secret.tsense': PARTS, 'root/main.tsense': `use "inner.tsense"\n${CHANNEL}`, 'root/inner.tsense': { link: '../outside/secret.tsense' } });
    const r = l.cli(['check', 'main.tsense']);
    expect(r.code).toBe(1);
    expect(codes(r)).toContain('import-outside-root');
    expect(r.out).toContain('symbolic link');
    // The junction behind the link was not imported.
    expect(codes(r)).toContain('unknown-name');
  });

  it('item 2: the language server\'s host refuses the same link', () => {
    const l = make({ 'outside/secret.tsense': PARTS, 'root/main.tsense': `use "inner.tsense"\n${CHANNEL}`, 'root/inner.tsense': { link: '../outside/secret.tsense' } });
    const docs = new OpenDocuments();
    docs.roots = [l.root];
    const main = path.join(l.root, 'main.tsense');
    const a = analyse({ path: main, text: `use "inner.tsense"\n${CHANNEL}`, root: docs.rootFor(main), host: docs.host() });
    expect(a.diagnostics.map((d) => d.code)).toContain('import-outside-root');
    expect(a.files).toHaveLength(1);
  });

  it('item 2: a link to a folder outside the root is refused too', () => {
    const l = make({ 'outside/parts.tsense': PARTS, 'root/main.tsense': `use "lib/parts.tsense"\n${CHANNEL}`, 'root/lib': { link: '../outside' } });
    const r = l.cli(['check', 'main.tsense']);
    expect(codes(r)).toContain('import-outside-root');
  });

  it('item 2: a link that stays inside the root is followed', () => {
    const l = make({ 'root/real/parts.tsense': PARTS, 'root/main.tsense': `use "lib/parts.tsense"\n${CHANNEL}`, 'root/lib': { link: 'real' } });
    const r = l.cli(['check', 'main.tsense']);
    expect(r.code).toBe(0);
  });

  it('item 3: two links to "." end as a cycle, not a hang (files are identified by real path)', () => {
    const l = make({
      'root/a.tsense': `use "l/a.tsense"\nuse "m/a.tsense"\n${CHANNEL}`,
      'root/l': { link: '.' },
      'root/m': { link: '.' },
    });
    const r = l.cli(['check', 'a.tsense']);
    expect(r.code).toBe(1);
    expect(codes(r).filter((c) => c === 'import-cycle')).toHaveLength(2);
  });

  it('item 3: one file reached through a link and directly is read once (no duplicate-name)', () => {
    const l = make({ 'root/parts.tsense': PARTS, 'root/l': { link: '.' }, 'root/main.tsense': `use "parts.tsense"\nuse "l/parts.tsense"\n${CHANNEL}` });
    const r = l.cli(['check', 'main.tsense']);
    expect(r.out).not.toContain('duplicate-name');
    expect(r.code).toBe(0);
  });
});

describe('issue #17: long chains and many problems', () => {
  it('item 4: a chain of 4,000 used files is read without overflowing the stack', () => {
    const files: Record<string, string> = { 'root/main.tsense': `use "f1.tsense"\n${CHANNEL}` };
    for (let i = 1; i < 4000; i++) files[`root/f${i}.tsense`] = `use "f${i + 1}.tsense"\n`;
    files['root/f4000.tsense'] = PARTS;
    const l = make(files);
    const r = l.cli(['check', 'main.tsense']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
  });

  it('item 4: a chain of 4,000 files with an error at its end reports it on every use line, and a cycle through it is shortened', () => {
    const files: Record<string, string> = { 'root/main.tsense': `use "f1.tsense"\n${CHANNEL}` };
    for (let i = 1; i < 4000; i++) files[`root/f${i}.tsense`] = `use "f${i + 1}.tsense"\n`;
    files['root/f4000.tsense'] = `use "f1.tsense"\n${PARTS}`;
    const l = make(files);
    const host = new DiskHost();
    const main = path.join(l.root, 'main.tsense');
    const a = analyse({ path: main, text: host.read(main)!, root: l.root, host });
    const cycle = a.diagnostics.find((d) => d.code === 'import-cycle')!;
    expect(cycle.message).toMatch(/f1\.tsense -> f2\.tsense -> f3\.tsense -> … 3996 more … -> f4000\.tsense -> f1\.tsense$/);
    expect(a.diagnostics.filter((d) => d.code === 'import-problems').length).toBeGreaterThan(0);
  });

  it('item 5: 20,000 bad lines list the first 200 and one closing "and N more" (more-problems, still an error)', () => {
    const l = make({ 'root/bad.tsense': Array.from({ length: 20000 }, (_, i) => `not a line ${i} !!`).join('\n') });
    const r = l.cli(['check', 'bad.tsense']);
    expect(r.code).toBe(1);
    const lines = r.out.split('\n').filter((x) => x.startsWith('bad.tsense:'));
    expect(lines).toHaveLength(201);
    expect(lines[200]).toMatch(/^bad\.tsense:201:1: error \[more-problems\] and 19800 more problems in this file from here on \(only the first 200 of 20000 are listed\)/);
  });
});

describe('issue #17: messages that echo user text', () => {
  it('item 17: control characters in a use path are escaped, never echoed raw', () => {
    const l = make({ 'root/main.tsense': `use "\u001b[2J\u001b[31mred\u0007.tsense"\n${CHANNEL}` });
    const r = l.cli(['check', 'main.tsense']);
    expect(r.out).not.toMatch(/[\u0000-\u0009\u000b-\u001f\u007f]/);
    expect(r.out).toContain('\\x1b[2J\\x1b[31mred\\x07.tsense');
  });

  it('item 17: a 100,000-digit value is shortened in the message', () => {
    const l = make({ 'root/parts.tsense': PARTS.replace('bits       = 12', `bits       = ${'9'.repeat(100000)}`), 'root/main.tsense': `use "parts.tsense"\n${CHANNEL}` });
    const r = l.cli(['check', 'main.tsense']);
    expect(r.code).toBe(1);
    for (const line of r.out.split('\n')) expect(line.length).toBeLessThan(400);
    expect(r.out).toContain('(100000 characters)');
  });
});

describe('issue #17 item 19: wording and path segments', () => {
  it('"is a channel", not "is an channel"', () => {
    const l = make({ 'root/main.tsense': `${PARTS}${CHANNEL}channel d {\n  sensor = c\n  adc = a\n  bias = current 20 uA\n  range = -10 °C .. 50 °C\n  resolution = 0.25 °C per count\n  accuracy = ± 0.5 °C\n}\n` });
    const r = l.cli(['check', 'main.tsense']);
    expect(r.out).toContain("'c' is a channel, but sensor needs");
  });

  it('use "." names the folder, not an empty file name', () => {
    const l = make({ 'root/main.tsense': `use "."\n${PARTS}${CHANNEL}` });
    const r = l.cli(['check', 'main.tsense']);
    expect(r.out).toContain("cannot read '.': it names the workspace root folder");
    expect(r.out).not.toContain('looked for  in');
  });

  it('a file named ..foo.tsense inside the root is used, not refused as outside it', () => {
    const l = make({ 'root/..foo.tsense': PARTS, 'root/main.tsense': `use "..foo.tsense"\n${CHANNEL}` });
    const r = l.cli(['check', 'main.tsense']);
    expect(r.out).not.toContain('import-outside-root');
    expect(r.code).toBe(0);
  });
});
