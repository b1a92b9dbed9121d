// Custom request behind the plot panel:
//   thermoscribe/plotData {uri, channel} -> {ok: true, data: PlotData} | {ok: false, message, channels}
// The data (server/src/plot/data.ts) comes from the document's current analysis and its live error
// budget; the client draws it with the shared chart spec. An unknown or broken channel is an answer
// (the panel shows the message and the channels there are), not an error.
import { ErrorCodes, ResponseError } from 'vscode-languageserver/node';
import { plotData, type PlotData } from '../../engine';
import type { ServerContext } from '../context';
import { channelOf } from './channel-of';

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
  /** The channel is written in the spec but its errors stop it (`message` names them). */
  blocked?: boolean;
}

export function onPlotData(ctx: ServerContext, params: PlotDataParams): PlotDataResult {
  if (typeof params?.uri !== 'string' || (params.channel !== undefined && typeof params.channel !== 'string')) {
    throw new ResponseError(ErrorCodes.InvalidParams, 'thermoscribe/plotData needs {uri, channel}');
  }
  const found = channelOf(ctx, params.uri, params.channel);
  if (!found.ok) return found;
  const r = found.result;
  return { ok: true, data: plotData(r, r.budget) };
}
