// The data behind the plots (server/src/plot) and the SVG the CLI writes. The channels are those of
// the invented greenhouse sample. Independent references are named beside each check.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyse, type Analysis } from '../../../server/src/engine';
import { channelBudget } from '../../../server/src/budget/budget';
import { plotBlockers, plotData } from '../../../server/src/plot/data';
import { LABELS, plotSpec, wrap } from '../../../server/src/plot/spec';
import { hover } from '../../../server/src/features/hover';
import { channelLenses } from '../../../server/src/features/code-lens';
import { CLI, ensureBuilt, ROOT } from '../../protocol/client';

const SAMPLE = path.join(ROOT, 'samples', 'greenhouse.tsense');
const host = { read: (p: string) => (fs.existsSync(p) ? fs.readFileSync(p, 'utf8') : undefined) };
let a: Analysis;

beforeAll(() => {
  a = analyse({ path: SAMPLE, text: fs.readFileSync(SAMPLE, 'utf8'), host });
});

type Spec = { data: { name: string; values: Record<string, number>[] }[]; marks: Mark[] };
type Mark = { type: string; name?: string; marks?: Mark[]; encode?: { enter?: Record<string, { value?: unknown; scale?: string }> } };
const allMarks = (ms: Mark[]): Mark[] => ms.flatMap((m) => [m, ...allMarks(m.marks ?? [])]);

describe('plot data', () => {
  it('has one value per budget temperature in every series, for every mode', () => {
    for (const r of a.channels) {
      const b = channelBudget(r.channel, { runs: 300, seed: 5 });
      const d = plotData(r, b);
      expect(d.error!.celsius).toEqual(b.celsius);
      expect(d.error!.modes.map((m) => m.mode).sort()).toEqual(['none', 'one-point', 'two-point']);
      for (const m of d.error!.modes) {
        for (const s of [m.worstLow, m.worstHigh, m.mc!.p1, m.mc!.p5, m.mc!.p50, m.mc!.p95, m.mc!.p99]) expect(s).toHaveLength(b.celsius.length);
      }
      const spec = plotSpec(d) as unknown as Spec;
      for (const m of d.error!.modes) expect(spec.data.find((x) => x.name === `err-${m.mode}`)!.values).toHaveLength(b.celsius.length);
    }
  });

  it('keeps the Monte Carlo percentiles inside the worst-case band and in order', () => {
    // The corner method bounds every board when the error is monotonic in each input (budget/worst-case.ts);
    // the budget counts samples outside the band, so the check applies where that count is 0.
    let checked = 0;
    for (const r of a.channels) {
      const b = channelBudget(r.channel, { runs: 500, seed: 11 });
      if (b.method !== 'corners' || b.samplesOutsideWorstCase > 0) continue;
      checked++;
      for (const m of plotData(r, b).error!.modes) {
        const mc = m.mc!;
        for (let i = 0; i < m.worstLow.length; i++) {
          const eps = 1e-9 * (1 + Math.abs(m.worstLow[i]!) + Math.abs(m.worstHigh[i]!));
          expect(mc.p1[i]!).toBeGreaterThanOrEqual(m.worstLow[i]! - eps);
          expect(mc.p99[i]!).toBeLessThanOrEqual(m.worstHigh[i]! + eps);
          expect(mc.p1[i]!).toBeLessThanOrEqual(mc.p5[i]!);
          expect(mc.p5[i]!).toBeLessThanOrEqual(mc.p50[i]!);
          expect(mc.p50[i]!).toBeLessThanOrEqual(mc.p95[i]!);
          expect(mc.p95[i]!).toBeLessThanOrEqual(mc.p99[i]!);
        }
      }
    }
    expect(checked).toBeGreaterThan(0);
  });

  it('draws the target lines at ± the stated accuracy in every error panel', () => {
    // The accuracy written in samples/greenhouse.tsense: bench_air ± 0.5 °C, soil ± 1 °C.
    for (const [name, accuracy] of [['bench_air', 0.5], ['soil', 1]] as const) {
      const r = a.channels.find((x) => x.channel.name === name)!;
      const d = plotData(r, r.budget);
      expect(d.error!.targetK).toBeCloseTo(accuracy, 12);
      const marks = allMarks((plotSpec(d) as unknown as Spec).marks);
      for (const mode of ['none', 'one-point', 'two-point']) {
        const hi = marks.find((m) => m.name === `target-high-${mode}`)!;
        const lo = marks.find((m) => m.name === `target-low-${mode}`)!;
        expect(hi.encode!.enter!['y']).toEqual({ scale: 'y', value: accuracy });
        expect(lo.encode!.enter!['y']).toEqual({ scale: 'y', value: -accuracy });
      }
    }
  });

  it('gives the sweep as the transfer curve, point by point', () => {
    for (const r of a.channels) {
      const d = plotData(r, r.budget);
      expect(d.transfer.celsius).toEqual(r.sweep.map((p) => p.celsius));
      expect(d.transfer.volts).toEqual(r.sweep.map((p) => p.volts));
      expect(d.transfer.code).toEqual(r.sweep.map((p) => p.code));
      // Ideal converter: code = floor(V / Vref * 2^bits), kept within 0 .. 2^bits - 1 (common practice, no source).
      const full = 2 ** d.transfer.bits;
      d.transfer.volts.forEach((v, i) => expect(d.transfer.code[i]).toBe(Math.min(full - 1, Math.max(0, Math.floor((v / d.transfer.referenceVolts) * full)))));
      const values = (plotSpec(d, { chart: 'transfer' }) as unknown as Spec).data.find((x) => x.name === 'transfer')!.values;
      values.forEach((row, i) => {
        expect(row['v']).toBeCloseTo(r.sweep[i]!.volts, 6);
        expect(row['code']).toBe(r.sweep[i]!.code);
      });
    }
  });

  it('shows a message instead of error panels when there is no budget', () => {
    const r = a.channels[0]!;
    const spec = plotSpec(plotData(r, null)) as unknown as Spec;
    expect(allMarks(spec.marks).some((m) => m.name === 'no-budget')).toBe(true);
    expect(JSON.stringify(spec)).not.toMatch(/NaN|Infinity/);
  });
});

describe('a channel stopped by errors (issue 14, item 9)', () => {
  it('names the errors that block its plot, with their lines, instead of "no channel named"', () => {
    const text = fs.readFileSync(SAMPLE, 'utf8').replace(/(channel bench_air \{[^}]*?adc\s*=\s*)(\w+)/, '$1no_such_adc');
    const broken = analyse({ path: SAMPLE, text, host });
    expect(broken.channels.some((r) => r.channel.name === 'bench_air')).toBe(false);
    const line = text.slice(0, text.indexOf('no_such_adc')).split('\n').length;
    const msg = plotBlockers(broken, 'bench_air')!;
    expect(msg).toMatch(new RegExp(`^channel 'bench_air' has no figures or plots until this error is fixed: line ${line}: .*no_such_adc.*\\[unknown-name\\]$`));
    expect(plotBlockers(broken, 'not_written_here')).toBeNull();
    expect(plotBlockers(a, 'bench_air')).toBeNull();
  });
});

describe('hover and code lenses', () => {
  it('puts a short summary first in the channel hover, and links to the plot panel for the budget tables (issue 14, item 8)', () => {
    const text = fs.readFileSync(SAMPLE, 'utf8');
    const at = text.indexOf('channel bench_air') + 'channel '.length + 2;
    const md = hover(a, at, { plotLink: (ch) => `command:show?${ch}` })!.markdown;
    const r = a.channels.find((x) => x.channel.name === 'bench_air')!;
    const summary = md.slice(0, md.indexOf('\n---\n'));
    expect(summary.split('\n').filter((l) => l.startsWith('- ')).map((l) => l.slice(2, l.indexOf(':')))).toEqual(['Current', 'Voltage', 'Slope', 'Worst resolution', 'Worst-case error']);
    expect(summary).toContain(`**±${Number(r.worstCaseBudget!.stated.worstAbsK.toPrecision(3))} K**`);
    expect(summary).toContain('two-point calibration at 0 °C and 40 °C');
    expect(summary).toContain('[Plots and error budget tables](command:show?bench_air)');
    // The tables are in the plot panel now, not in the hover.
    expect(md).not.toContain('**Error budget**');
    expect(md).not.toContain('| input |');
  });

  it('puts one lens on each channel name of the file', () => {
    const lenses = channelLenses(a);
    expect(lenses.map((l) => l.channel)).toEqual(['bench_air', 'soil', 'heat_mat', 'canopy']);
    const text = fs.readFileSync(SAMPLE, 'utf8');
    for (const l of lenses) expect(text.slice(l.span.start, l.span.end)).toBe(l.channel);
  });
});

/** A structural check of XML 1.0 well-formedness (w3.org/TR/xml): one root, every tag closed in order. */
function wellFormed(xml: string): string | null {
  const stack: string[] = [];
  let roots = 0;
  const re = /<(\/?)([A-Za-z_][\w:.-]*)((?:\s+[\w:.-]+\s*=\s*(?:"[^"]*"|'[^']*'))*)\s*(\/?)>|<!--[\s\S]*?-->|<\?[\s\S]*?\?>|<!\[CDATA\[[\s\S]*?\]\]>|(<)/g;
  let m: RegExpExecArray | null;
  let last = 0;
  while ((m = re.exec(xml))) {
    const between = xml.slice(last, m.index);
    if (/[<>]/.test(between) || /&(?!(?:amp|lt|gt|quot|apos|#\d+|#x[0-9a-fA-F]+);)/.test(between)) return `bad text before offset ${m.index}`;
    last = re.lastIndex;
    if (m[5]) return `stray < at ${m.index}`;
    if (!m[2]) continue;
    if (m[1]) {
      if (stack.pop() !== m[2]) return `</${m[2]}> closes the wrong element at ${m.index}`;
    } else if (!m[4]) {
      if (stack.length === 0) roots++;
      stack.push(m[2]);
    } else if (stack.length === 0) roots++;
  }
  if (xml.slice(last).trim() !== '') return 'text after the root';
  if (stack.length) return `unclosed <${stack[stack.length - 1]}>`;
  return roots === 1 ? null : `${roots} root elements`;
}

describe('thermoscribe plot', () => {
  let dir: string;
  beforeAll(() => {
    ensureBuilt();
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-plot-'));
  });
  const cli = (...args: string[]) => spawnSync(process.execPath, [CLI, 'plot', ...args], { cwd: ROOT, encoding: 'utf8' });

  it('writes a well-formed SVG with both charts and their series labels', () => {
    const out = path.join(dir, 'bench.svg');
    const r = cli(SAMPLE, '--channel', 'bench_air', '--out', out, '--runs', '400', '--seed', '3');
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const svg = fs.readFileSync(out, 'utf8');
    expect(wellFormed(svg)).toBeNull();
    // The SVG namespace of W3C SVG 1.1 (w3.org/TR/SVG11/struct.html#SVGElement).
    expect(svg).toMatch(/^<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    for (const label of [`${'Sensed voltage'} at the ADC input`, LABELS.code, LABELS.worst, LABELS.mcOuter, LABELS.mcInner, LABELS.median, `${LABELS.target} ±0.5 K`, 'No calibration', 'Two-point calibration at 0 °C and 40 °C (stated)', 'Monte Carlo 400 boards (seed 3)']) {
      expect(svg).toContain(`>${label}`);
    }
    expect(svg).not.toMatch(/NaN|Infinity/);
    expect(fs.readdirSync(dir).filter((f) => f.endsWith('.tmp'))).toEqual([]);
  });

  it('writes one chart with --chart', () => {
    const out = path.join(dir, 'transfer.svg');
    expect(cli(SAMPLE, '--channel', 'soil', '--out', out, '--chart', 'transfer').status).toBe(0);
    const svg = fs.readFileSync(out, 'utf8');
    expect(wellFormed(svg)).toBeNull();
    expect(svg).toContain('>ADC code');
    expect(svg).not.toContain(`>${LABELS.worst}`);
  });

  it('exits 2 with the list of channels for an unknown channel, and for bad options', () => {
    const r = cli(SAMPLE, '--channel', 'roof', '--out', path.join(dir, 'x.svg'));
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("no channel named 'roof'; channels: bench_air, soil, heat_mat, canopy");
    expect(cli(SAMPLE, '--channel', 'soil').status).toBe(2);
    expect(cli(SAMPLE, '--channel', 'soil', '--out', path.join(dir, 'y.svg'), '--chart', 'pie').stderr).toContain("--chart takes both, transfer, error, dynamics or residuals (got 'pie')");
    expect(cli(SAMPLE, '--channel', 'soil', '--out', path.join(dir, 'y.svg'), '--runs', '-1').status).toBe(2);
    expect(cli(path.join(dir, 'missing.tsense'), '--channel', 'soil', '--out', path.join(dir, 'y.svg')).status).toBe(2);
    expect(fs.existsSync(path.join(dir, 'x.svg'))).toBe(false);
  });
});

describe('a chart sized to its panel (issue 14, item 9)', () => {
  it('wraps headings at the plot width, so a narrow panel gets a narrow chart rather than a shrunken one', () => {
    // Common practice, no source: about 0.56 em a character for a proportional sans-serif font.
    for (const line of wrap('Channel bench_air: error against temperature (reported minus true)', 300, 14)) expect(line.length * 14 * 0.56).toBeLessThanOrEqual(300);
    const data = plotData(a.channels.find((x) => x.channel.name === 'bench_air')!, a.channels.find((x) => x.channel.name === 'bench_air')!.budget);
    const spec = plotSpec(data, { width: 300 }) as { width: number; marks: { name?: string; encode?: { enter?: { text?: { value?: unknown } } } }[] };
    expect(spec.width).toBe(300);
    const headings = spec.marks.filter((m) => m.name?.startsWith('heading-')).map((m) => m.encode!.enter!.text!.value as string[]);
    expect(headings.length).toBeGreaterThan(0);
    for (const h of headings) for (const line of h) expect(line.length * (11 + 3) * 0.56).toBeLessThanOrEqual(300);
  });
});
