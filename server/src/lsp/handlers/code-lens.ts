// textDocument/codeLens: a lens on each channel that runs the client's thermoscribe.showPlot
// command with the document URI and the channel name.
import type { CodeLens, CodeLensParams } from 'vscode-languageserver/node';
import { channelLenses } from '../../engine';
import type { ServerContext } from '../context';
import { toRange } from '../convert';

export const SHOW_PLOT_COMMAND = 'thermoscribe.showPlot';

export function onCodeLens(ctx: ServerContext, params: CodeLensParams): CodeLens[] {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return [];
  return channelLenses(ctx.analyses.get(doc)).map((l) => ({
    range: toRange(doc, l.span),
    command: { title: l.title, command: SHOW_PLOT_COMMAND, arguments: [params.textDocument.uri, l.channel] },
  }));
}
