// The plot panel's script, run inside the VS Code webview (a browser page under a strict CSP):
// receives the plot data from the extension, builds the shared chart spec (server/src/plot/spec.ts)
// with a theme read from the editor's CSS variables, and renders it with Vega's SVG renderer.
// Expressions go through vega-interpreter, so no `eval` is needed; nothing is loaded from the network.
import { View, parse, type Spec } from 'vega';
import { expressionInterpreter } from 'vega-interpreter';
import { plotSpec } from '../../server/src/plot/spec';
import { NEUTRAL_THEME, type PlotTheme } from '../../server/src/plot/theme';
import type { PlotData } from '../../server/src/plot/data';

interface VsCodeApi {
  postMessage(message: unknown): void;
}
declare function acquireVsCodeApi(): VsCodeApi;

type Incoming = { type: 'data'; data: PlotData } | { type: 'problem'; message: string; channels: string[]; blocked?: boolean };

const vscode = acquireVsCodeApi();
const chart = document.getElementById('chart')!;
const status = document.getElementById('status')!;
const budget = document.getElementById('budget')!;
let last: PlotData | null = null;
let view: View | null = null;

/** The editor's colour for a variable, or a fallback when the theme does not define it. */
function cssVar(name: string, fallback: string): string {
  const v = getComputedStyle(document.body).getPropertyValue(name).trim();
  return v || fallback;
}

/** A chart theme from the editor's colours (--vscode-editor-*, --vscode-charts-*). */
function editorTheme(): PlotTheme {
  const fg = cssVar('--vscode-editor-foreground', NEUTRAL_THEME.foreground);
  // The editor's font size (the text beside the panel), not the smaller workbench size.
  const size = parseFloat(cssVar('--vscode-editor-font-size', cssVar('--vscode-font-size', '13')));
  return {
    ...NEUTRAL_THEME,
    background: cssVar('--vscode-editor-background', NEUTRAL_THEME.background),
    foreground: fg,
    muted: cssVar('--vscode-descriptionForeground', fg),
    font: cssVar('--vscode-font-family', NEUTRAL_THEME.font),
    fontSize: Number.isFinite(size) && size > 6 ? Math.min(Math.max(size, 12), 18) : 13,
    volts: cssVar('--vscode-charts-green', fg),
    code: cssVar('--vscode-charts-purple', fg),
    worst: cssVar('--vscode-charts-orange', fg),
    worstOpacity: 0.25,
    mcOuter: cssVar('--vscode-charts-blue', fg),
    mcOuterOpacity: 0.25,
    mcInner: cssVar('--vscode-charts-blue', fg),
    mcInnerOpacity: 0.45,
    median: cssVar('--vscode-charts-blue', fg),
    target: cssVar('--vscode-charts-red', fg),
    calibration: cssVar('--vscode-charts-yellow', fg),
  };
}

/** Room the axes, their titles and the padding take beside the plot width, px (measured once drawn). */
let margin = 110;

async function draw(): Promise<void> {
  if (!last) return;
  // The chart takes the panel's width: the plot width is what is left after the axes. Once drawn,
  // the SVG's real width tells what the axes took, and the chart is drawn again to fit if needed.
  const available = Math.max(280, chart.clientWidth || document.body.clientWidth - 32);
  for (let pass = 0; pass < 2; pass++) {
    const width = Math.max(240, Math.min(1400, available - margin));
    const spec = plotSpec(last, { theme: editorTheme(), width });
    view?.finalize();
    chart.textContent = '';
    chart.dataset['state'] = 'drawing';
    view = new View(parse(spec as Spec, undefined, { ast: true }), { renderer: 'svg', container: chart, hover: false, expr: expressionInterpreter });
    await view.runAsync();
    const drawn = Number(chart.querySelector('svg')?.getAttribute('width') ?? NaN);
    if (!Number.isFinite(drawn) || drawn <= available + 1 || pass === 1) break;
    margin = drawn - width;
  }
  chart.dataset['state'] = 'ready';
  chart.dataset['channel'] = last.channel;
  chart.dataset['width'] = String(Math.round(chart.querySelector('svg')?.getBoundingClientRect().width ?? 0));
}

/** The error budget's table (moved here from the channel hover): worst case and Monte Carlo per calibration. */
function budgetTable(d: PlotData): void {
  budget.textContent = '';
  const e = d.error;
  if (!e) return;
  const caption = document.createElement('div');
  caption.className = 'caption';
  caption.textContent = `Error budget${e.targetK !== null ? ` (target ±${fmt(e.targetK)} K)` : ''}`;
  const table = document.createElement('table');
  const row = (cells: string[], head = false) => {
    const tr = document.createElement('tr');
    for (const c of cells) {
      const td = document.createElement(head ? 'th' : 'td');
      td.textContent = c;
      tr.appendChild(td);
    }
    table.appendChild(tr);
  };
  row(['calibration', 'worst case', 'Monte Carlo 1–99 %'], true);
  const verdict = (k: number) => (e.targetK === null ? '' : k <= e.targetK ? ' ✓' : ' ✗');
  for (const m of e.modes) row([`${m.label}${m.stated ? ' (stated)' : ''}`, `±${fmt(m.worstAbsK)} K${verdict(m.worstAbsK)}`, m.mcP99AbsK === null ? '-' : `±${fmt(m.mcP99AbsK)} K`]);
  budget.append(caption, table);
}

const fmt = (x: number) => (Number.isFinite(x) ? String(Number(x.toPrecision(3))) : 'n/a');

window.addEventListener('message', (event: MessageEvent<Incoming>) => {
  const m = event.data;
  if (m?.type === 'data') {
    last = m.data;
    status.className = '';
    status.textContent = m.data.notes.join(' ');
    budgetTable(m.data);
    draw().catch((err: unknown) => showProblem(`Drawing failed: ${err instanceof Error ? err.message : String(err)}`));
  } else if (m?.type === 'problem') {
    showProblem(m.message + (m.channels.length && !m.blocked ? `. Channels in this spec: ${m.channels.join(', ')}.` : ''));
  }
});

function showProblem(text: string): void {
  status.className = 'problem';
  status.textContent = text;
  chart.dataset['state'] = last ? 'stale' : 'problem';
}

// Theme changes switch the body's class (vscode-light, vscode-dark, ...): redraw in the new colours.
new MutationObserver(() => void draw().catch(() => undefined)).observe(document.body, { attributes: true, attributeFilter: ['class'] });
let resizeTimer: ReturnType<typeof setTimeout> | undefined;
window.addEventListener('resize', () => {
  if (resizeTimer) clearTimeout(resizeTimer);
  resizeTimer = setTimeout(() => void draw().catch(() => undefined), 200);
});

vscode.postMessage({ type: 'ready' });
