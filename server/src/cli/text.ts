// Human-readable CLI text: diagnostics as `file:line:col: severity [code] message`, 1-based.
import * as path from 'node:path';
import type { Diagnostic } from '../engine';
import type { LineIndex } from '../engine';
import { escapeControls } from '../engine';

export function formatDiagnostic(d: Diagnostic, index: LineIndex, cwd: string): string {
  const p = index.position(d.span.start);
  // A file name may hold control characters too; a terminal must not act on them.
  const rel = escapeControls(path.relative(cwd, d.file) || d.file);
  return `${rel}:${p.line + 1}:${p.character + 1}: ${d.severity} [${d.code}] ${d.message}`;
}

/** Left-aligned text table with a header rule. */
export function table(header: string[], rows: string[][]): string {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) => cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join('  ').trimEnd();
  return [line(header), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}
