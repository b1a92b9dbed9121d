// The only place that maps engine results (UTF-16 offsets, severities, feature kinds) to LSP types.
import {
  DiagnosticSeverity,
  type Diagnostic as LspDiagnostic,
  type Range,
} from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { Analysis, Diagnostic, Severity } from '../engine';
import type { Span } from '../engine';
import { pathToUri } from './documents';

export function toRange(doc: TextDocument, span: Span): Range {
  return { start: doc.positionAt(span.start), end: doc.positionAt(span.end) };
}

export function toSpan(doc: TextDocument, range: Range): Span {
  return { start: doc.offsetAt(range.start), end: doc.offsetAt(range.end) };
}

const SEVERITY: Record<Severity, DiagnosticSeverity> = {
  error: DiagnosticSeverity.Error,
  warning: DiagnosticSeverity.Warning,
  info: DiagnosticSeverity.Information,
};

export function toDiagnostic(doc: TextDocument, d: Diagnostic): LspDiagnostic {
  return {
    range: toRange(doc, d.span),
    severity: SEVERITY[d.severity],
    code: d.code,
    source: 'thermoscribe',
    message: d.message,
    ...(d.data ? { data: d.data } : {}),
  };
}

/**
 * A text document for a file of an analysis (the entry or a used file), to convert its spans;
 * the open document itself when given.
 */
export function docForFile(a: Analysis, file: string, open?: TextDocument): TextDocument | undefined {
  if (open) return open;
  const f = a.files.find((x) => x.path === file);
  return f ? TextDocument.create(pathToUri(file), 'tsense', 0, f.text) : undefined;
}
