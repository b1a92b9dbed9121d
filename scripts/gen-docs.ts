// Writes the generated parts of README.md (field reference, diagnostic catalogue) from the
// engine's own tables, so the docs cannot drift from the code. `npm run docs`; a unit test
// fails when README.md is stale.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { allBlocks } from '../server/src/model/schema';
import { CATALOGUE } from '../server/src/checks/catalogue';

export function fieldReference(): string {
  const out: string[] = [];
  for (const b of allBlocks().values()) {
    out.push(`#### \`${b.kind}\``, '', b.doc, '', '| field | default | meaning | example |', '| --- | --- | --- | --- |');
    for (const f of b.fields) {
      const name = [f.name, ...(f.aliases ?? [])].map((n) => `\`${n}\``).join(' or ');
      out.push(`| ${name} | ${f.defaultText ? esc(f.defaultText) : '**required**'} | ${esc(f.doc)} | \`${f.example.replace(/\|/g, '\\|')}\` |`);
    }
    out.push('');
  }
  return out.join('\n');
}

export function diagnosticReference(): string {
  const out = ['| code | severity | meaning |', '| --- | --- | --- |'];
  for (const [code, info] of Object.entries(CATALOGUE)) out.push(`| \`${code}\` | ${info.severity} | **${esc(info.title)}.** ${esc(info.doc)} |`);
  return out.join('\n');
}

function esc(s: string): string {
  return s.replace(/\|/g, '\\|').replace(/\n/g, ' ');
}

export function renderReadme(text: string): string {
  return replaceBetween(replaceBetween(text, 'fields', fieldReference()), 'diagnostics', diagnosticReference());
}

function replaceBetween(text: string, name: string, body: string): string {
  const begin = `<!-- generated:${name} (npm run docs) -->`;
  const end = `<!-- end generated:${name} -->`;
  const a = text.indexOf(begin);
  const b = text.indexOf(end);
  if (a < 0 || b < a) throw new Error(`README.md lacks the markers for ${name}`);
  return text.slice(0, a + begin.length) + '\n' + body + '\n' + text.slice(b);
}

if (require.main === module) {
  const p = path.join(__dirname, '..', 'README.md');
  fs.writeFileSync(p, renderReadme(fs.readFileSync(p, 'utf8')));
  console.log('docs: README.md reference sections regenerated');
}
