// Tokenizes spec lines with the TextMate grammar (syntaxes/tsense.tmLanguage.json) using the
// vscode-textmate and vscode-oniguruma copies that ship inside code-server, the engine the editor
// itself uses. Expected token kinds follow the language's grammar (grammar/tsense.peggy); the
// resistor codes follow IEC 60062 (the letter marks the decimal point: 4k7 = 4.7 kΩ, 1R5 = 1.5 Ω).
import * as path from 'node:path';
import { readFileSync } from 'node:fs';
import { CODE_SERVER_DIR, ROOT } from './paths';
import type { Outcome } from './browser';

interface Token { startIndex: number; endIndex: number; scopes: string[] }
interface Grammar { tokenizeLine(line: string, state: unknown): { tokens: Token[]; ruleStack: unknown } }

const MODULES = path.join(CODE_SERVER_DIR, 'lib', 'node_modules', 'code-server', 'lib', 'vscode', 'node_modules');

// [line, token text, scope the token must carry]; lines are tokenized in order, as one document.
const EXPECT: [string, string, string][] = [
  ['use "parts/junctions.tsense"  # parts', 'use', 'keyword.control.import.tsense'],
  ['use "parts/junctions.tsense"  # parts', 'parts/junctions.tsense', 'string.quoted.double.tsense'],
  ['use "parts/junctions.tsense"  # parts', ' parts', 'comment.line.number-sign.tsense'],
  ['junction q1 {', 'junction', 'storage.type.block.tsense'],
  ['junction q1 {', 'q1', 'entity.name.type.block.tsense'],
  ['  IS = 10 fA +/- 40 %', 'IS', 'support.type.property-name.tsense'],
  ['  IS = 10 fA +/- 40 %', 'fA', 'keyword.other.unit.tsense'],
  ['  IS = 10 fA +/- 40 %', '+/-', 'keyword.operator.tolerance.tsense'],
  ['  IS = 10 fA +/- 40 %', '%', 'keyword.other.unit.tsense'],
  ['  RS = 1R5 ohm; theta_ja = 400 K/W', '1R5', 'constant.numeric.iec.tsense'],
  ['  RS = 1R5 ohm; theta_ja = 400 K/W', 'theta_ja', 'support.type.property-name.tsense'],
  ['  RS = 1R5 ohm; theta_ja = 400 K/W', 'K/W', 'keyword.other.unit.tsense'],
  ['}', '}', 'punctuation.section.block.end.tsense'],
  ['channel c {', 'channel', 'storage.type.block.tsense'],
  ['  bias = resistor 4M7 ± 1 % from 3.3 V', 'resistor', 'keyword.other.tsense'],
  ['  bias = resistor 4M7 ± 1 % from 3.3 V', '4M7', 'constant.numeric.iec.tsense'],
  ['  bias = resistor 4M7 ± 1 % from 3.3 V', '±', 'keyword.operator.tolerance.tsense'],
  ['  bias = resistor 4M7 ± 1 % from 3.3 V', '3.3', 'constant.numeric.decimal.tsense'],
  ['  range = -40 °C..125 °C', '-40', 'constant.numeric.decimal.tsense'],
  ['  range = -40 °C..125 °C', '°C', 'keyword.other.unit.tsense'],
  ['  range = -40 °C..125 °C', '..', 'keyword.operator.range.tsense'],
  ['  resolution = 10 counts per °C', 'counts', 'keyword.other.unit.tsense'],
  ['  EG = 1.11 eV', 'eV', 'keyword.other.unit.tsense'],
  ['  sensor = generic_npn', 'generic_npn', 'variable.other.reference.tsense'],
  ['  kind = npn', 'npn', 'constant.language.tsense'],
  ['  colour = 2k2', 'colour', 'variable.other.property.tsense'],
  ['  colour = 2k2', '2k2', 'constant.numeric.iec.tsense'],
  // A missing brace: the next header still starts a block (the parser reads it so too).
  ['sensr d {', 'sensr', 'invalid.illegal.block-keyword.tsense'],
];

export async function checkGrammar(): Promise<Outcome> {
  const name = 'grammar: TextMate scopes of spec tokens';
  try {
    /* eslint-disable @typescript-eslint/no-require-imports */
    const tm = require(path.join(MODULES, 'vscode-textmate')) as {
      Registry: new (o: unknown) => { loadGrammar(scope: string): Promise<Grammar | null> };
      parseRawGrammar(text: string, file: string): unknown;
      INITIAL: unknown;
    };
    const onig = require(path.join(MODULES, 'vscode-oniguruma')) as {
      loadWASM(data: ArrayBuffer): Promise<void>;
      OnigScanner: new (p: string[]) => unknown;
      OnigString: new (s: string) => unknown;
    };
    const wasm = readFileSync(path.join(MODULES, 'vscode-oniguruma', 'release', 'onig.wasm'));
    await onig.loadWASM(wasm.buffer.slice(wasm.byteOffset, wasm.byteOffset + wasm.byteLength) as ArrayBuffer);
    const grammarFile = path.join(ROOT, 'syntaxes', 'tsense.tmLanguage.json');
    const registry = new tm.Registry({
      onigLib: Promise.resolve({ createOnigScanner: (p: string[]) => new onig.OnigScanner(p), createOnigString: (s: string) => new onig.OnigString(s) }),
      loadGrammar: async () => tm.parseRawGrammar(readFileSync(grammarFile, 'utf8'), grammarFile),
    });
    const grammar = await registry.loadGrammar('source.tsense');
    if (!grammar) throw new Error('grammar source.tsense did not load');
    const lines = [...new Set(EXPECT.map(([line]) => line))];
    const tokens = new Map<string, Token[]>();
    let state = tm.INITIAL;
    for (const line of lines) {
      const r = grammar.tokenizeLine(line, state);
      tokens.set(line, r.tokens);
      state = r.ruleStack;
    }
    const wrong: string[] = [];
    for (const [line, text, scope] of EXPECT) {
      const token = tokens.get(line)!.find((t) => line.slice(t.startIndex, t.endIndex) === text);
      if (!token?.scopes.includes(scope)) wrong.push(`'${text}' in '${line.trim()}': ${token ? token.scopes.join(' > ') : 'not a token of its own'} (expected ${scope})`);
    }
    if (wrong.length > 0) return { name, ok: false, detail: wrong.join('; ') };
    return { name, ok: true, detail: `${EXPECT.length} tokens` };
  } catch (err) {
    return { name, ok: false, detail: err instanceof Error ? err.message : String(err) };
  }
}
