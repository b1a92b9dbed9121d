// Custom request behind the plot panel:
//   thermoscribe/plotData {uri, channel} -> {ok: true, data: PlotData} | {ok: false, message, channels}
// The data (server/src/plot/data.ts) comes from the document's current analysis and its live error
// budget; the client draws it with the shared chart spec. An unknown or broken channel is an answer
// (the panel shows the message and the channels there are), not an error.
import { ErrorCodes, ResponseError } from 'vscode-languageserver/node';
import { plotData, type PlotData } from '../../plot/data';
import { analyse, type Analysis } from '../../engine';
import type { ServerContext } from '../context';
import { uriToPath } from '../documents';

export const PLOT_DATA = 'thermoscribe/plotData';

export interface PlotDataParams {
  uri: string;
  channel?: string;
}

/** `data` when ok; otherwise `message` and the channels the spec has. */
export interface PlotDataResult {
  ok: boolean;
  data?: PlotData;
  message?: string;
  channels?: string[];
}

export function onPlotData(ctx: ServerContext, params: PlotDataParams): PlotDataResult {
  if (typeof params?.uri !== 'string' || (params.channel !== undefined && typeof params.channel !== 'string')) {
    throw new ResponseError(ErrorCodes.InvalidParams, 'thermoscribe/plotData needs {uri, channel}');
  }
  const a = analysisOf(ctx, params.uri);
  if (!a) return { ok: false, message: `cannot read ${params.uri}`, channels: [] };
  const own = a.model.channels.filter((c) => c.file === a.path).map((c) => c.name);
  if (params.channel === undefined) return { ok: false, message: 'name a channel', channels: own };
  const r = a.channels.find((x) => x.channel.name === params.channel && x.channel.file === a.path);
  if (!r) {
    const defined = own.includes(params.channel);
    return {
      ok: false,
      message: defined ? `channel '${params.channel}' cannot be analysed: see the problems list` : `no channel named '${params.channel}' in this file`,
      channels: own,
    };
  }
  return { ok: true, data: plotData(r, r.budget) };
}

/** The open document's analysis, or the file read through the document host when it is not open. */
export function analysisOf(ctx: ServerContext, uri: string): Analysis | undefined {
  const open = ctx.documents.get(uri);
  if (open) return ctx.analyses.get(open);
  const p = uriToPath(uri, ctx.documents.roots);
  const host = ctx.documents.host();
  const text = host.read(p);
  return text === undefined ? undefined : analyse({ path: p, text, root: ctx.documents.rootFor(p), host });
}
