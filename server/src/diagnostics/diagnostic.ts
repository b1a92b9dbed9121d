// The engine's diagnostic: offsets into one file, a stable code, a message with the figure.
import type { Span } from '../syntax/ast';
import { CATALOGUE, type DiagnosticCode, type Severity } from './catalogue';
import { escapeControls } from './shown';

export interface Diagnostic {
  code: DiagnosticCode;
  severity: Severity;
  message: string;
  /** Path of the file the span belongs to (as given to the engine). */
  file: string;
  span: Span;
  /** Extra machine-readable facts for code actions (e.g. a suggested value). */
  data?: Record<string, unknown>;
}

/**
 * Collects diagnostics; severity comes from the catalogue unless overridden. Messages quote user
 * text through `shown()` (checks/shown.ts); as a last net no message keeps a control character.
 */
export class DiagnosticSink {
  readonly items: Diagnostic[] = [];
  report(code: DiagnosticCode, file: string, span: Span, message: string, data?: Record<string, unknown>): void {
    this.items.push({ code, severity: CATALOGUE[code].severity, message: escapeControls(message, true), file, span, ...(data ? { data } : {}) });
  }
}
