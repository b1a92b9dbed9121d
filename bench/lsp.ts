// Language-server benchmark, through the real server process (`node dist/cli.js serve --stdio`):
// time from didChange to the publishDiagnostics of that version (debounce set to 0 so it is
// excluded), and hover / completion response times, p50 and p95, on samples/greenhouse.tsense and
// on a generated 200-channel spec. Targets are printed beside the figures; nothing is asserted.
// Run alone: npx tsx bench/lsp.ts (builds dist/cli.js first when it is stale).
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { ensureBuilt, ROOT, TestClient, type Position } from '../tests/protocol/client';
import { generateSpec } from './generate';
import { percentile, verdict } from './stats';

const TARGET_DIAGNOSTICS_P95_MS = 30;
const TARGET_HOVER_P95_MS = 5;

function ms(t0: bigint): number {
  return Number(process.hrtime.bigint() - t0) / 1e6;
}

function positionOf(text: string, needle: string, shift: number): Position {
  const at = text.indexOf(needle);
  const before = text.slice(0, at + shift).split('\n');
  return { line: before.length - 1, character: before[before.length - 1]!.length };
}

interface Figures {
  diagnostics: number[];
  hover: number[];
  completion: number[];
}

async function measure(client: TestClient, file: string, text: string, edits: number, probes: number): Promise<Figures> {
  const uri = client.open(file, text);
  await client.diagnostics(uri, 1);
  const figures: Figures = { diagnostics: [], hover: [], completion: [] };
  // Each change retypes the upper end of the first channel's range as the editor sends it (an
  // incremental edit of that number), with a value no earlier version had: every version is new
  // to the server's caches, as while typing.
  const site = text.indexOf('.. 50 °C') >= 0 ? '.. 50 °C' : '.. 125 °C';
  const oldNumber = site.slice(3, site.indexOf(' °C'));
  const start = positionOf(text, site, 3);
  let current = oldNumber;
  for (let i = 0; i < edits; i++) {
    const next = String(Number(oldNumber) - 1 - i);
    const range = { start, end: { line: start.line, character: start.character + current.length } };
    const t0 = process.hrtime.bigint();
    const v = client.edit(uri, range, next);
    await client.diagnostics(uri, v);
    figures.diagnostics.push(ms(t0));
    current = next;
  }
  const v = client.change(uri, text);
  await client.diagnostics(uri, v);
  const channelLine = text.lastIndexOf('channel ');
  const name = text.slice(channelLine, text.indexOf('{', channelLine));
  const hoverAt = positionOf(text, name, 'channel '.length + 1);
  const completeAt = positionOf(text, 'bias ', 0);
  for (let i = 0; i < probes; i++) {
    let t0 = process.hrtime.bigint();
    await client.request('textDocument/hover', { textDocument: { uri }, position: hoverAt });
    figures.hover.push(ms(t0));
    t0 = process.hrtime.bigint();
    await client.request('textDocument/completion', { textDocument: { uri }, position: completeAt });
    figures.completion.push(ms(t0));
  }
  client.close(uri);
  return figures;
}

function line(label: string, values: number[], target?: number): string {
  const p50 = percentile(values, 50);
  const p95 = percentile(values, 95);
  const t = target === undefined ? '' : `   target p95 <= ${target} ms: ${verdict(p95 <= target)}`;
  return `  ${label.padEnd(34)} p50 ${p50.toFixed(2).padStart(7)} ms   p95 ${p95.toFixed(2).padStart(7)} ms${t}`;
}

export async function benchLsp(): Promise<void> {
  ensureBuilt();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thermoscribe-bench-'));
  const big = path.join(dir, 'rig-200.tsense');
  const bigText = generateSpec(200);
  fs.writeFileSync(big, bigText);
  const nodeArgs = process.env.BENCH_SERVER_NODE_ARGS?.split(' ').filter(Boolean) ?? [];
  const client = await TestClient.start({ rootDir: ROOT, nodeArgs, initializationOptions: { debounceMs: 0 }, settings: { debounceMs: 0 } });
  try {
    console.log('\nLanguage server (real process over stdio; debounce 0):');
    const sample = path.join(ROOT, 'samples', 'greenhouse.tsense');
    const small = await measure(client, sample, fs.readFileSync(sample, 'utf8'), 40, 100);
    console.log(` samples/greenhouse.tsense`);
    console.log(line('didChange -> publishDiagnostics', small.diagnostics, TARGET_DIAGNOSTICS_P95_MS));
    console.log(line('hover (channel name)', small.hover, TARGET_HOVER_P95_MS));
    console.log(line('completion (field value)', small.completion));
    const large = await measure(client, big, bigText, 40, 100);
    console.log(` generated spec, 200 channels, ${bigText.split('\n').length} lines`);
    console.log(line('didChange -> publishDiagnostics', large.diagnostics, TARGET_DIAGNOSTICS_P95_MS));
    console.log(line('hover (channel name)', large.hover, TARGET_HOVER_P95_MS));
    console.log(line('completion (field value)', large.completion));
  } finally {
    await client.stop();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

if (require.main === module) void benchLsp();
