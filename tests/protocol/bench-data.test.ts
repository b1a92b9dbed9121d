// Protocol tests of a channel's bench data (`bench_data`) in the language server, through the real
// server process over stdio: the plot panel's data (thermoscribe/plotData) carries the measured
// points' residuals, and a change of the CSV file on disk, reported by the client's file watcher
// (LSP 3.17 workspace/didChangeWatchedFiles, FileChangeType 2 = Changed), has the spec analysed again
// and its diagnostics published again. The spec and its CSV are the invented probe of
// tests/fixtures/diagnostics/bench-data-file.quiet.tsense, copied to a temporary folder; its row 10 is
// an unsettled reading, 7 counts low (invented). Waits on notifications, never on timers.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuilt, ROOT, TestClient, uriOf, type LspDiagnostic } from './client';

interface ResidualPoint { source: string; celsius: number; residualK: number; leaveOneOutK: number | null; toleranceK: number; outlier: boolean }
interface PlotAnswer { ok: boolean; data?: { channel: string; residuals?: { model: string; rule: string; points: ResidualPoint[] }; cautions: string[] } }

const FIXTURE = path.join(ROOT, 'tests', 'fixtures', 'diagnostics');
let dir: string;
let csv: string;
let client: TestClient;
let uri: string;
let good: string;

const codes = (d: LspDiagnostic[]) => d.map((x) => x.code);
const changed = (file: string) => void client.conn.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(file), type: 2 }] });

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-bench-lsp-'));
  fs.mkdirSync(path.join(dir, 'bench'));
  good = fs.readFileSync(path.join(FIXTURE, 'bench', 'good.csv'), 'utf8');
  csv = path.join(dir, 'bench', 'good.csv');
  fs.writeFileSync(csv, good);
  const spec = path.join(dir, 'probe.tsense');
  fs.copyFileSync(path.join(FIXTURE, 'bench-data-file.quiet.tsense'), spec);
  client = await TestClient.start({ rootDir: dir, settings: { debounceMs: 0 } });
  uri = client.open(spec);
});

afterAll(async () => {
  await client.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('bench data in the language server', () => {
  it('the plot data carries each point\'s residual, the outlier flag and the fitted model', async () => {
    expect(codes(await client.diagnosticsWhere(uri, (d) => codes(d).includes('calibration-outlier')))).toContain('calibration-outlier');
    const r = await client.request<PlotAnswer>('thermoscribe/plotData', { uri, channel: 'probe' });
    const res = r.data!.residuals!;
    expect(res.points).toHaveLength(9);
    expect(res.points.filter((p) => p.outlier).map((p) => p.source)).toEqual(['row 10, board P1']);
    expect(res.points.every((p) => p.toleranceK === 0.5)).toBe(true);
    expect(res.model).toMatch(/^junction model of 'q' fitted to all 9 points/);
    expect(res.rule).toMatch(/^a point is flagged when/);
    expect(r.data!.cautions).toEqual([]);
  });

  it('a change of the CSV on disk is analysed again and published: the outlier corrected, then a bad row named by row and column', async () => {
    // Row 10 read again after settling: 7 counts higher, on the others' trend.
    fs.writeFileSync(csv, good.replace('5.0,2026,P1', '5.0,2033,P1'));
    const before = client.publications(uri).length;
    changed(csv);
    const fixed = await client.diagnosticsWhere(uri, (d) => !codes(d).includes('calibration-outlier'), before);
    expect(codes(fixed)).not.toContain('bench-data-row');
    const r = await client.request<PlotAnswer>('thermoscribe/plotData', { uri, channel: 'probe' });
    expect(r.data!.residuals!.points.some((p) => p.outlier)).toBe(false);
    expect(r.data!.residuals!.points.find((p) => p.source.startsWith('row 10'))!.celsius).toBe(5);

    fs.writeFileSync(csv, good.replace('5.0,2026,P1', '5.0,20x6,P1'));
    const next = client.publications(uri).length;
    changed(csv);
    const bad = await client.diagnosticsWhere(uri, (d) => codes(d).includes('bench-data-row'), next);
    expect(bad.find((d) => d.code === 'bench-data-row')!.message).toMatch(/row 10, column 2 \(code\): '20x6' is not a number/);
    const again = await client.request<PlotAnswer>('thermoscribe/plotData', { uri, channel: 'probe' });
    expect(again.data!.residuals!.points).toHaveLength(8);
  });

  it('a file that disappears is an error on the path; back again, the points return', async () => {
    fs.rmSync(csv);
    let n = client.publications(uri).length;
    void client.conn.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(csv), type: 3 }] });
    const gone = await client.diagnosticsWhere(uri, (d) => codes(d).includes('bench-data-file'), n);
    expect(gone.find((d) => d.code === 'bench-data-file')!.message).toMatch(/cannot read it/);
    fs.writeFileSync(csv, good);
    n = client.publications(uri).length;
    void client.conn.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(csv), type: 1 }] });
    const back = await client.diagnosticsWhere(uri, (d) => !codes(d).includes('bench-data-file'), n);
    expect(codes(back)).toContain('calibration-outlier');
  });
});
