// What every channel check receives.
import type { ChannelResult } from '../analysis/types';
import type { ChannelDef } from '../model/types';
import type { Span } from '../syntax/ast';
import type { DiagnosticSink } from '../diagnostics/diagnostic';

export interface CheckContext {
  channel: ChannelDef;
  result: ChannelResult;
  sink: DiagnosticSink;
  /** Codes already reported for this channel (lets a check defer to a more basic one). */
  reported: Set<string>;
}

/** Span of a channel field's value, or the channel name when the field took its default. */
export function fieldSpan(c: ChannelDef, field: string): Span {
  return c.fieldSpans[field] ?? c.nameSpan;
}
