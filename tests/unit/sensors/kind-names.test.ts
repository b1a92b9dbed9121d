// Sensor kinds as modules: outside a kind's own folder (server/src/sensors/<kind>/) no code names a
// registered kind, so a new kind is its folder plus one registry line and nothing else branches on
// it (DEVELOPERS.md, "How to add a sensor kind"). Finds every string literal (and literal type)
// whose text is a kind's name with the TypeScript parser.
import * as fs from 'node:fs';
import * as path from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';
import { sensorKinds } from '../../../server/src/sensors/registry';

const SRC = path.resolve(__dirname, '../../../server/src');

function sources(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) return sources(p);
    // Generated files (npm run docs) are written from the registry, not by hand.
    return /\.ts$/.test(e.name) && !/\.d\.ts$|\.generated\.ts$/.test(e.name) ? [p] : [];
  });
}

/** `file:line 'name'` of every literal naming a kind outside that kind's folder (paths relative to server/src). */
function strays(files: readonly { rel: string; text: string }[], kinds: readonly string[]): string[] {
  const out: string[] = [];
  for (const { rel, text } of files) {
    const sf = ts.createSourceFile(rel, text, ts.ScriptTarget.Latest, true);
    const visit = (node: ts.Node): void => {
      if ((ts.isStringLiteral(node) || ts.isNoSubstitutionTemplateLiteral(node)) && kinds.includes(node.text)) {
        // A kind may name itself; a module path ('./junction') is not a literal of a kind's name.
        const own = rel.startsWith(`sensors/${node.text}/`);
        const isPath = ts.isImportDeclaration(node.parent) || ts.isExportDeclaration(node.parent);
        if (!own && !isPath) out.push(`${rel}:${sf.getLineAndCharacterOfPosition(node.getStart()).line + 1} '${node.text}'`);
      }
      ts.forEachChild(node, visit);
    };
    visit(sf);
  }
  return out;
}

const tree = () => sources(SRC).map((file) => ({ rel: path.relative(SRC, file).split(path.sep).join('/'), text: fs.readFileSync(file, 'utf8') }));

describe('sensor kind names', () => {
  it('appear as literals only in their own folder under server/src/sensors/', () => {
    const kinds = sensorKinds().map((k) => k.name);
    expect(kinds.length).toBeGreaterThan(0);
    expect(strays(tree(), kinds)).toEqual([]);
  });

  it('a planted comparison outside the folder is found, the same inside it is not', () => {
    const [k] = sensorKinds().map((x) => x.name);
    const code = `export const is = (s: { kind: string }) => s.kind === '${k}';\ntype T = { kind: '${k}' };\n`;
    expect(strays([{ rel: 'analysis/planted.ts', text: code }], [k!])).toEqual([`analysis/planted.ts:1 '${k}'`, `analysis/planted.ts:2 '${k}'`]);
    expect(strays([{ rel: `sensors/${k}/planted.ts`, text: code }], [k!])).toEqual([]);
  });
});
