// The comparison panel's page as HTML text (no editor API): the server's formatted cells laid out as
// plain tables that fit the panel (cells wrap at their spaces, the number and its unit kept
// together), and the explanation and the caution as flowing paragraphs.
import { escapeHtml, webviewPage } from './webview-page';

export interface CompareAnswer {
  ok: boolean;
  groupNames: string[];
  headers?: string[];
  groups?: { name: string; rows: { channel: string; notes: string[] }[]; cells: string[][] }[];
  errors?: number;
  explain?: string;
  caution?: string;
  message?: string;
}

/**
 * A figure cell may wrap only between its figures ("0.0145 °C @ -40 °C" breaks at the "@"), never
 * between a number and its unit, nor after a sign: those spaces become no-break spaces.
 */
function keepUnits(cell: string): string {
  return escapeHtml(cell).replace(/(\d) (?=[^\s\d@])/g, '$1&nbsp;');
}

/** A name may break after an underscore when its column is narrow. */
function breakable(name: string): string {
  return escapeHtml(name).replace(/_/g, '_<wbr>');
}

export function compareProblem(message: string): string {
  return `<p class="status problem">${escapeHtml(message)}</p>`;
}

export function compareTables(a: CompareAnswer): string {
  const headers = a.headers ?? [];
  const out: string[] = [];
  for (const g of a.groups ?? []) {
    out.push(`<h2>Measurement <code>${escapeHtml(g.name)}</code>: ${g.rows.length} candidate${g.rows.length === 1 ? '' : 's'}</h2>`);
    // Two layouts of the same cells; the page's width picks one (see comparePage): candidates as
    // rows when the panel is wide, as columns when it is narrow (a panel beside the editor).
    out.push('<table class="wide"><thead><tr>' + headers.map((h, i) => `<th class="${i < 2 ? 'text' : 'num'}">${escapeHtml(h)}</th>`).join('') + '</tr></thead><tbody>');
    for (const row of g.cells) out.push('<tr>' + row.map((c, i) => `<td class="${i < 2 ? 'text' : 'num'}">${i < 2 ? escapeHtml(c) : keepUnits(c)}</td>`).join('') + '</tr>');
    out.push('</tbody></table>');
    out.push('<table class="narrow"><thead><tr><th></th>' + g.cells.map((row) => `<th class="num name">${breakable(row[0] ?? '')}</th>`).join('') + '</tr></thead><tbody>');
    headers.forEach((h, i) => {
      if (i === 0) return;
      out.push(`<tr><th class="text">${escapeHtml(h)}</th>` + g.cells.map((row) => `<td class="num${i < 2 ? ' name' : ''}">${i < 2 ? breakable(row[i] ?? '') : keepUnits(row[i] ?? '')}</td>`).join('') + '</tr>');
    });
    out.push('</tbody></table>');
    const notes = g.rows.flatMap((r) => r.notes.map((n) => `<li><code>${escapeHtml(r.channel)}</code>: ${escapeHtml(n)}</li>`));
    if (notes.length) out.push(`<ul class="notes">${notes.join('')}</ul>`);
  }
  if (a.errors) out.push(compareProblem(`The spec has ${a.errors} error${a.errors === 1 ? '' : 's'}; channels with errors may be missing (see the problems list).`));
  if (a.explain) out.push(`<p class="explain">${escapeHtml(a.explain)}</p>`);
  if (a.caution) out.push(`<p class="caution">${escapeHtml(a.caution)}</p>`);
  return out.join('\n');
}

/** The narrowest page (CSS px) that shows the candidates as rows: the nine columns of the samples need about 720. */
const WIDE_MIN = 760;

export function comparePage(title: string, body: string): string {
  // No script, nothing remote: only the inline style, admitted by its nonce.
  // The table fits the panel rather than push its last column out of view: below WIDE_MIN the
  // candidates become columns (one per candidate, a row per figure); figure cells wrap only between
  // figures (keepUnits), and a name too long for its column breaks where it must.
  const style = `  h2 { font-size: 1.1em; font-weight: 600; margin: 16px 0 6px; }
  table { border-collapse: collapse; margin-bottom: 6px; max-width: 100%; }
  table.narrow { display: none; }
  @media (max-width: ${WIDE_MIN - 1}px) { table.wide { display: none; } table.narrow { display: table; } }
  .name { overflow-wrap: anywhere; }
  tbody th { text-align: left; }
  th, td { padding: 3px 6px; border-bottom: 1px solid var(--vscode-panel-border, var(--vscode-editorWidget-border)); vertical-align: top; }
  th { color: var(--vscode-descriptionForeground); font-weight: 600; }
  .num { text-align: right; font-variant-numeric: tabular-nums; }
  .text { text-align: left; }
  tbody tr:hover { background: var(--vscode-list-hoverBackground); }
  code { font-family: var(--vscode-editor-font-family); }
  .notes, .explain, .caution, .status { color: var(--vscode-descriptionForeground); max-width: 60em; }
  .problem { color: var(--vscode-errorForeground); }
  .caution { border-left: 3px solid var(--vscode-editorWarning-foreground); padding-left: 8px; }`;
  return webviewPage(title, (nonce) => `default-src 'none'; style-src 'nonce-${nonce}';`, style, () => body);
}
