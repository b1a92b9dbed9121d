// `vsce package` on its own, with no option (issue #14 item 15): the manifest says how to package
// (package.json "vsce": no dependency scan, no public repository, links kept relative to the
// package), and the packaged README links only to files that the package holds. Needs a build
// (dist/) like the other tests that run the CLI; packaging reads local files only, no network.
import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const ROOT = path.resolve(__dirname, '../../..');
const VSCE = path.join(ROOT, 'node_modules', '@vscode', 'vsce', 'vsce');
let tmp: string;
beforeAll(() => { tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-vsce-')); });
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

/** Runs vsce with stdin closed: a question it would ask (a missing repository) reads no answer and aborts. */
function vsce(args: string[]) {
  return spawnSync(process.execPath, [VSCE, ...args], { cwd: ROOT, encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
}

describe('packaging with vsce and no options', () => {
  it('`vsce package` writes a .vsix without asking anything', () => {
    const out = path.join(tmp, 'plain.vsix');
    const r = vsce(['package', '--out', out]);
    expect(r.status, r.stdout + r.stderr).toBe(0);
    expect(r.stdout + r.stderr).not.toMatch(/ERROR|Do you want to continue/);
    expect(fs.statSync(out).size).toBeGreaterThan(0);
  });

  it('the packaged README links only to files in the package (DEVELOPERS.md is not one) and shows no image', () => {
    const r = vsce(['ls']);
    expect(r.status, r.stderr).toBe(0);
    const packaged = new Set(r.stdout.split('\n').map((l) => l.trim()).filter(Boolean));
    expect(packaged.has('README.md')).toBe(true);
    expect(packaged.has('DEVELOPERS.md')).toBe(false);
    // The package's README is the build's copy of README.md without its screenshot (vsce takes only
    // https images in a packaged README, and no public repository is named to make one of it).
    const manifest = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { vsce: { readmePath?: string } };
    expect(manifest.vsce.readmePath).toBe('dist/README.md');
    const readme = fs.readFileSync(path.join(ROOT, manifest.vsce.readmePath!), 'utf8');
    const links = [...readme.matchAll(/\]\(([^)\s]+)\)|<img[^>]+src="([^"]+)"/g)].map((m) => (m[1] ?? m[2])!);
    const relative = links.filter((l) => !/^[a-z]+:/i.test(l) && !l.startsWith('#')).map((l) => l.replace(/^\.\//, '').replace(/#.*$/, ''));
    for (const target of relative) expect(packaged, `README links to ${target}, which the .vsix does not hold`).toContain(target);
    expect(readme).not.toMatch(/\]\(DEVELOPERS\.md/);
    expect(readme).not.toMatch(/!\[|<img/);
    // Nothing else differs from the repository's README.
    const source = fs.readFileSync(path.join(ROOT, 'README.md'), 'utf8');
    const strip = (t: string) => t.split('\n').filter((l) => !l.startsWith('![')).join('\n').replace(/\n{3,}/g, '\n\n');
    expect(readme).toBe(strip(source));
  });

  it("the repository's README shows the editor screenshot that the editor run takes", () => {
    const source = fs.readFileSync(path.join(ROOT, 'README.md'), 'utf8');
    expect(source).toMatch(/^!\[[^\]]+\]\(media\/editor-tour\.png\)$/m);
    const png = fs.readFileSync(path.join(ROOT, 'media', 'editor-tour.png'));
    expect(png.subarray(1, 4).toString('latin1')).toBe('PNG');
  });
});
