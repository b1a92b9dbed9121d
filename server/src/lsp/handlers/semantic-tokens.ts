// textDocument/semanticTokens/full: the engine's tokens, delta-encoded by line and character.
import type { SemanticTokens, SemanticTokensLegend, SemanticTokensParams } from 'vscode-languageserver/node';
import { semanticTokens, TOKEN_MODIFIERS, TOKEN_TYPES } from '../../engine';
import type { ServerContext } from '../context';

export const LEGEND: SemanticTokensLegend = { tokenTypes: [...TOKEN_TYPES], tokenModifiers: [...TOKEN_MODIFIERS] };

export function onSemanticTokens(ctx: ServerContext, params: SemanticTokensParams): SemanticTokens {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return { data: [] };
  const data: number[] = [];
  let prevLine = 0;
  let prevChar = 0;
  for (const t of semanticTokens(ctx.analyses.syntax(doc))) {
    const p = doc.positionAt(t.start);
    data.push(p.line - prevLine, p.line === prevLine ? p.character - prevChar : p.character, t.length, TOKEN_TYPES.indexOf(t.type), t.declaration ? 1 : 0);
    prevLine = p.line;
    prevChar = p.character;
  }
  return { data };
}
