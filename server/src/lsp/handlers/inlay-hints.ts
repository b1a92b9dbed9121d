// textDocument/inlayHint: computed figures at line ends; off when thermoscribe.inlayHints.enabled is false.
import { InlayHintKind, type InlayHint, type InlayHintParams } from 'vscode-languageserver/node';
import { inlayHints } from '../../engine';
import type { ServerContext } from '../context';
import { toSpan } from '../convert';

export function onInlayHints(ctx: ServerContext, params: InlayHintParams): InlayHint[] {
  if (!ctx.settings.inlayHintsEnabled) return [];
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return [];
  return inlayHints(ctx.analyses.get(doc), toSpan(doc, params.range)).map((h) => ({
    position: doc.positionAt(h.offset),
    label: h.label,
    kind: InlayHintKind.Type,
    paddingLeft: true,
    ...(h.tooltip ? { tooltip: h.tooltip } : {}),
  }));
}
