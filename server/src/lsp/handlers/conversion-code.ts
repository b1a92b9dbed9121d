// Custom requests behind the client's "Insert conversion code" command (used from a C or C++ file):
//   thermoscribe/conversionChannels {uris}          -> [{uri, channel}] the channels code can be made for
//   thermoscribe/conversionCode     {uri, channel}  -> {text, method, maxErrorC} the marked source block
// A spec that is not open is read through the document host (open documents first, then the disk).
import { ResponseError, ErrorCodes } from 'vscode-languageserver/node';
import { generatableResults } from '../../engine';
import { conversionBlock } from '../../engine';
import type { ServerContext } from '../context';
import { analysisOf } from './channel-of';

export const CONVERSION_CHANNELS = 'thermoscribe/conversionChannels';
export const CONVERSION_CODE = 'thermoscribe/conversionCode';

export interface ConversionChannelsParams {
  uris: string[];
}
export interface ConversionCodeParams {
  uri: string;
  channel: string;
  /** Line ending of the file the text goes into (default \n). */
  eol?: '\n' | '\r\n';
}
export interface ConversionCodeResult {
  text: string;
  method: string;
  maxErrorC: number;
}

export function onConversionChannels(ctx: ServerContext, params: ConversionChannelsParams): { uri: string; channel: string }[] {
  const out: { uri: string; channel: string }[] = [];
  for (const uri of Array.isArray(params?.uris) ? params.uris.slice(0, 500) : []) {
    if (typeof uri !== 'string') continue;
    const a = analysisOf(ctx, uri);
    if (!a) continue;
    // Only the spec's own channels: a used file's channels are listed under that file.
    for (const r of generatableResults(a.channels, a.diagnostics)) if (r.channel.file === a.path) out.push({ uri, channel: r.channel.name });
  }
  return out;
}

export function onConversionCode(ctx: ServerContext, params: ConversionCodeParams): ConversionCodeResult {
  if (typeof params?.uri !== 'string' || typeof params.channel !== 'string') {
    throw new ResponseError(ErrorCodes.InvalidParams, 'thermoscribe/conversionCode needs {uri, channel}');
  }
  const a = analysisOf(ctx, params.uri);
  if (!a) throw new ResponseError(ErrorCodes.InvalidParams, `cannot read ${params.uri}`);
  const g = conversionBlock(a, params.channel, params.eol === '\r\n' ? '\r\n' : '\n');
  if (!g.ok) throw new ResponseError(ErrorCodes.InvalidRequest, g.message);
  return { text: g.text, method: g.method, maxErrorC: g.maxErrorC };
}
