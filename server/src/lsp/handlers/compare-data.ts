// Custom request behind the comparison panel:
//   thermoscribe/compareData {uri, group?} -> {ok: true, ...} | {ok: false, message, groups}
// The rows come from the compare module (server/src/compare/compare.ts), the same as
// `thermoscribe compare --format json`; the cells are the CLI table's text (compare/cells.ts), so
// the panel formats nothing itself. A missing group or an unreadable file is an answer, not an error.
import { ErrorCodes, ResponseError } from 'vscode-languageserver/node';
import { compareGroups, type CompareRow } from '../../engine';
import type { PairedDifference } from '../../engine';
import { COMPARE_EXPLAIN, COMPARE_HEADERS, compareCells } from '../../engine';
import { cautionParagraphFor } from '../../engine';
import type { ServerContext } from '../context';
import { analysisOf } from './channel-of';

export const COMPARE_DATA = 'thermoscribe/compareData';

export interface CompareDataParams {
  uri: string;
  group?: string;
}

export interface CompareDataGroup {
  name: string;
  rows: CompareRow[];
  /** Pairs on one converter (their notes are in the rows' notes too). */
  differences: PairedDifference[];
  /** The rows' cells as the CLI prints them, in the order of `headers`. */
  cells: string[][];
}

export interface CompareDataResult {
  ok: boolean;
  /** The group names of the spec (also when not ok). */
  groupNames: string[];
  headers?: string[];
  groups?: CompareDataGroup[];
  /** Errors in the spec, which may leave channels out of the table. */
  errors?: number;
  explain?: string;
  caution?: string;
  message?: string;
}

export function onCompareData(ctx: ServerContext, params: CompareDataParams): CompareDataResult {
  if (typeof params?.uri !== 'string' || (params.group !== undefined && typeof params.group !== 'string')) {
    throw new ResponseError(ErrorCodes.InvalidParams, 'thermoscribe/compareData needs {uri, group?}');
  }
  const a = analysisOf(ctx, params.uri);
  if (!a) return { ok: false, groupNames: [], message: `cannot read ${params.uri}` };
  if (a.channels.length === 0) return { ok: false, groupNames: [], message: 'no channel could be analysed: see the problems list' };
  let groups = compareGroups(a);
  const groupNames = groups.map((g) => g.name);
  if (params.group !== undefined) {
    groups = groups.filter((g) => g.name === params.group);
    if (groups.length === 0) return { ok: false, groupNames, message: `no group named '${params.group}'` };
  }
  return {
    ok: true,
    groupNames,
    headers: [...COMPARE_HEADERS],
    groups: groups.map((g) => ({ name: g.name, rows: g.rows, differences: g.differences, cells: g.rows.map(compareCells) })),
    errors: a.diagnostics.filter((d) => d.severity === 'error').length,
    explain: COMPARE_EXPLAIN.join(' '),
    caution: cautionParagraphFor(a.channels.map((r) => r.channel)),
  };
}
