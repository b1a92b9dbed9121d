// Data-driven tests of the pure language features (server/src/features): each fixture in
// tests/fixtures/features/<feature>/ is a spec (a `|` marks the cursor where one is needed) beside
// its expected output `<name>.expected.*`. The expected files are reviewed engine output; run with
// UPDATE_EXPECT=1 to rewrite them on purpose, then review the diff. Independent checks (standards,
// published facts) are asserted separately below, each naming its source.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse, type Analysis } from '../../../server/src/engine';
import { hover } from '../../../server/src/features/hover';
import { completion } from '../../../server/src/features/completion';
import { formatText } from '../../../server/src/features/format';
import { inlayHints } from '../../../server/src/features/inlay';
import { quickFixes, iecCode } from '../../../server/src/features/quickfix';
import { documentSymbols } from '../../../server/src/features/symbols';
import { foldingRanges } from '../../../server/src/features/folding';
import { semanticTokens } from '../../../server/src/features/semantic-tokens';
import { definition, prepareRename, rename, references } from '../../../server/src/features/navigation';

const FIXTURES = path.resolve(__dirname, '..', '..', 'fixtures', 'features');
const UPDATE = process.env['UPDATE_EXPECT'] === '1';

const host = (overrides?: Map<string, string>) => ({
  read: (p: string) => overrides?.get(p) ?? (fs.existsSync(p) ? fs.readFileSync(p, 'utf8') : undefined),
});

function load(file: string, text: string, overrides?: Map<string, string>): Analysis {
  return analyse({ path: file, text: overrides?.get(file) ?? text, root: FIXTURES, host: host(overrides) });
}

function withCursor(marked: string): { text: string; offset: number } {
  const offset = marked.indexOf('|');
  if (offset < 0) return { text: marked, offset: -1 };
  return { text: marked.slice(0, offset) + marked.slice(offset + 1), offset };
}

/** One check per fixture of a feature: render the feature's result to text and compare. */
function check(feature: string, ext: string, render: (a: Analysis, offset: number, text: string, file: string) => string): void {
  const dir = path.join(FIXTURES, feature);
  for (const name of fs.readdirSync(dir).filter((n) => n.endsWith('.tsense') && !n.includes('.expected.'))) {
    it(`${feature}: ${name}`, () => {
      const file = path.join(dir, name);
      const { text, offset } = withCursor(fs.readFileSync(file, 'utf8'));
      const actual = render(load(file, text), offset, text, file);
      const expectedFile = path.join(dir, name.replace(/\.tsense$/, `.expected.${ext}`));
      if (UPDATE || !fs.existsSync(expectedFile)) fs.writeFileSync(expectedFile, actual);
      expect(actual).toBe(fs.readFileSync(expectedFile, 'utf8'));
    });
  }
}

describe('data-driven features', () => {
  check('hover', 'md', (a, offset) => {
    const h = hover(a, offset);
    return h ? `span ${h.span.start}..${h.span.end}\n\n${h.markdown}\n` : '(no hover)\n';
  });
  check('completion', 'txt', (a, offset) => completion(a, offset).map((i) => `${i.kind} ${i.label}${i.detail ? ` | ${i.detail}` : ''}${i.insertText ? ` | ${JSON.stringify(i.insertText)}` : ''}`).join('\n') + '\n');
  check('format', 'tsense', (_a, _o, text) => {
    const r = formatText(text);
    return r.ok ? r.text : `(refused: ${r.reason})\n`;
  });
  check('inlay', 'txt', (a, _o, text) => {
    let out = text;
    for (const h of [...inlayHints(a)].sort((x, y) => y.offset - x.offset)) out = `${out.slice(0, h.offset)} ⟨${h.label}⟩${out.slice(h.offset)}`;
    return out;
  });
  check('outline', 'txt', (a, _o, text) => {
    const lines = documentSymbols(a.files[0]!).map((s) => `${s.label} ${s.name}${s.detail ? ` (${s.detail})` : ''}\n${s.children.map((c) => `  ${c.label} ${c.name} = ${c.detail}`).join('\n')}`);
    const folds = foldingRanges(a.files[0]!).map((f) => `fold ${f.kind} ${JSON.stringify(text.slice(f.span.start, f.span.start + 12))}..${JSON.stringify(text.slice(f.span.end - 1, f.span.end))}`);
    const tokens = semanticTokens(a.files[0]!).map((t) => `${t.type}${t.declaration ? '+decl' : ''} ${JSON.stringify(text.slice(t.start, t.start + t.length))}`);
    return [...lines, ...folds, ...tokens].join('\n') + '\n';
  });
  check('quickfix', 'txt', (a, _o, text, file) => {
    const fixes = quickFixes({ analysis: a, range: { start: 0, end: text.length }, reanalyse: (o) => load(file, text, o) });
    return fixes.map((f) => `[${f.diagnostic.code}] ${f.title}\n${f.edits.map((e) => `  ${path.relative(FIXTURES, e.file)}: ${JSON.stringify(a.files.find((x) => x.path === e.file)!.text.slice(e.span.start, e.span.end))} -> ${JSON.stringify(e.newText)}`).join('\n')}`).join('\n') + '\n';
  });
});

describe('independent checks', () => {
  it('writes resistances in the IEC 60062 resistor code', () => {
    // IEC 60062:2016, clause 4 (letter code for resistance values): 4K7 = 4.7 kΩ, 1M5 = 1.5 MΩ, 4R7 = 4.7 Ω.
    expect(iecCode(4700)).toBe('4k7');
    expect(iecCode(82000)).toBe('82k');
    expect(iecCode(1.5e6)).toBe('1M5');
    expect(iecCode(4.7)).toBe('4R7');
    expect(iecCode(470)).toBe('470');
    expect(iecCode(1e6)).toBe('1M');
  });

  it('formats idempotently and keeps every non-blank character', () => {
    const dir = path.join(FIXTURES, 'format');
    for (const name of ['messy.tsense']) {
      const text = fs.readFileSync(path.join(dir, name), 'utf8');
      const once = formatText(text);
      expect(once.ok).toBe(true);
      if (!once.ok) continue;
      const twice = formatText(once.text);
      expect(twice.ok && twice.text).toBe(once.text);
      expect(once.text.replace(/[\s;]/g, '')).toBe(text.replace(/[\s;]/g, ''));
    }
    for (const sample of ['greenhouse.tsense', 'cold-chain-problems.tsense', 'parts/junctions.tsense']) {
      const text = fs.readFileSync(path.resolve(FIXTURES, '..', '..', '..', 'samples', sample), 'utf8');
      const r = formatText(text);
      expect(r.ok && formatText(r.text)).toEqual(r);
    }
  });

  it('shows LSB = reference / 2^bits on an ADC', () => {
    // Ideal ADC code width Q = FSR / 2^N (IEEE Std 1241-2010, 3.1): 3.3 V / 1024 = 3.22 mV.
    const file = path.join(FIXTURES, 'hover', 'adc.tsense');
    const { text, offset } = withCursor(fs.readFileSync(file, 'utf8'));
    expect(hover(load(file, text), offset)?.markdown).toContain('LSB 3.22 mV');
  });

  it('renames definitions and references, refusing invalid names with a message', () => {
    const file = path.join(FIXTURES, 'lsp', 'main.tsense');
    const text = fs.readFileSync(file, 'utf8');
    const a = load(file, text);
    const at = text.indexOf('tight_adc', text.indexOf('adc        = tight_adc'));
    expect(references(a, at, true)).toHaveLength(2);
    expect(prepareRename(a, at)).toMatchObject({ ok: true, placeholder: 'tight_adc' });
    const ok = rename(a, at, 'slow_adc');
    expect(ok.ok && ok.edits.map((e) => e.newText)).toEqual(['slow_adc', 'slow_adc']);
    expect(rename(a, at, 'bad name')).toMatchObject({ ok: false, message: expect.stringMatching(/not a valid name/) });
    expect(rename(a, at, 'board_adc')).toMatchObject({ ok: false, message: expect.stringMatching(/already defined/) });
  });
});

describe('navigation for every named block kind (samples)', () => {
  // The defect: F2 on `thermistor bath_bead` renamed only the definition, F2 on `sensor = bath_bead`
  // was refused naming the wrong kind, and F12 on the usage found nothing (the rtd likewise).
  const SAMPLES = path.resolve(__dirname, '..', '..', '..', 'samples');
  for (const [file, name] of [['sous-vide.tsense', 'bath_bead'], ['kiln.tsense', 'chamber_pt']] as const) {
    it(`${file}: ${name} from its definition and from its usage`, () => {
      const p = path.join(SAMPLES, file);
      const text = fs.readFileSync(p, 'utf8');
      const a = analyse({ path: p, text, root: SAMPLES, host: host() });
      const def = text.indexOf(` ${name} {`) + 1;
      const use = text.indexOf(`= ${name}`) + 2;
      expect(definition(a, use)).toEqual({ file: p, span: { start: def, end: def + name.length } });
      expect(references(a, use, true).map((r) => r.span.start).sort((x, y) => x - y)).toEqual([def, use]);
      for (const at of [def, use]) {
        const r = rename(a, at, 'probe_2');
        expect(r.ok && r.edits.map((e) => e.span.start).sort((x, y) => x - y)).toEqual([def, use]);
      }
    });
  }
});

describe('independent checks: resistive sensor hovers', () => {
  const at = (name: string) => {
    const file = path.join(FIXTURES, 'hover', name);
    const { text, offset } = withCursor(fs.readFileSync(file, 'utf8'));
    return hover(load(file, text), offset)!.markdown;
  };

  it('shows an RTD with the IEC 60751 coefficients its alpha, class tolerances and resistances', () => {
    const md = at('rtd-block.tsense');
    // IEC 60751: alpha = (R100 - R0)/(100 R0) = 0.00385055 /°C for A = 3.9083e-3, B = -5.775e-7
    // (R100/R0 = 1 + 100 A + 10^4 B = 1.385055; the standard's nominal 0.00385, from memory).
    expect(md).toContain('α = (R100 − R0)/(100 °C · R0) = 0.0038505 /°C');
    // Class A ±(0.15 + 0.002|t|) °C (IEC 60751 table, from memory): 0.19 at -20 °C, 0.45 at 150 °C.
    expect(md).toContain('| `rtd_ch` | -20 °C | 922 Ω | ±0.19 °C | 150 °C | 1.57 kΩ | ±0.45 °C |');
    // Pt1000 at -20 °C: 921.60 Ω in the IEC 60751 reference table (from memory); 150 °C: 1573.25 Ω
    // (CVD quadratic 1000 (1 + 150 A + 150² B), published equation).
  });

  it("an RTD's bias hover has no line on the junction's current range (a junction rule)", () => {
    const md = at('rtd-bias.tsense');
    // 2 mA through 100 Ω: the table row shows the bias current (Ohm's law; common practice, no source).
    expect(md).toContain('**bias of pt_ch**');
    expect(md).toContain('2 mA');
    expect(md).not.toMatch(/current range where|current_window|works well/);
  });

  it('shows a beta-model thermistor with R at the channel range ends', () => {
    const md = at('thermistor-block.tsense');
    // Beta model R(T) = R25 exp(beta (1/T - 1/298.15 K)) (published equation; Steinhart & Hart 1968
    // beta form): 10 kΩ, beta 3435 K: 12.17 kΩ at 20 °C, 1.118 kΩ at 95 °C.
    const r = (c: number) => 10e3 * Math.exp(3435 * (1 / (c + 273.15) - 1 / 298.15));
    expect(r(20)).toBeCloseTo(12172, -1);
    expect(md).toContain(`| \`ntc_ch\` | 20 °C | ${(r(20) / 1e3).toPrecision(3)} kΩ | 95 °C | ${(r(95) / 1e3).toPrecision(3)} kΩ |`);
    // Steinhart-Hart form of the beta model: B = 1/beta, C = 0 (published equation, physics/steinhart-hart.ts).
    expect(md).toContain(`B ${(1 / 3435).toPrecision(5)}`.replace(/0\.000(\d)(\d+)/, '$1.$2e-4'));
  });
});
