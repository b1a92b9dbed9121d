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

type Incoming = { type: 'data'; data: PlotData } | { type: 'problem'; message: string; channels: string[] };

const vscode = acquireVsCodeApi();
const chart = document.getElementById('chart')!;
const status = document.getElementById('status')!;
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
  const size = parseFloat(cssVar('--vscode-font-size', '12'));
  return {
    ...NEUTRAL_THEME,
    background: cssVar('--vscode-editor-background', NEUTRAL_THEME.background),
    foreground: fg,
    muted: cssVar('--vscode-descriptionForeground', fg),
    font: cssVar('--vscode-font-family', NEUTRAL_THEME.font),
    fontSize: Number.isFinite(size) && size > 6 ? Math.min(size, 16) : 12,
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

async function draw(): Promise<void> {
  if (!last) return;
  const width = Math.max(320, Math.min(900, document.body.clientWidth - 140));
  const spec = plotSpec(last, { theme: editorTheme(), width });
  view?.finalize();
  chart.textContent = '';
  chart.dataset['state'] = 'drawing';
  view = new View(parse(spec as Spec, undefined, { ast: true }), { renderer: 'svg', container: chart, hover: false, expr: expressionInterpreter });
  await view.runAsync();
  chart.dataset['state'] = 'ready';
  chart.dataset['channel'] = last.channel;
}

window.addEventListener('message', (event: MessageEvent<Incoming>) => {
  const m = event.data;
  if (m?.type === 'data') {
    last = m.data;
    status.className = '';
    status.textContent = m.data.notes.join(' ');
    draw().catch((err: unknown) => showProblem(`Drawing failed: ${err instanceof Error ? err.message : String(err)}`));
  } else if (m?.type === 'problem') {
    showProblem(m.message + (m.channels.length ? `. Channels in this spec: ${m.channels.join(', ')}.` : ''));
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
