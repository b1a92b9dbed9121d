// Code lenses: one "Show plots" lens on the name of each channel of the entry file, carrying the
// channel's name. The server layer turns it into a command the client runs (thermoscribe.showPlot).
import type { Analysis } from '../analysis/result';
import type { Span } from '../syntax/ast';

export interface ChannelLens {
  span: Span;
  channel: string;
  title: string;
}

export function channelLenses(a: Analysis): ChannelLens[] {
  // Every channel written in this file, including one that cannot be analysed: the panel says why.
  return a.model.channels
    .filter((c) => c.file === a.path)
    .map((c) => ({ span: c.nameSpan, channel: c.name, title: 'Show plots: transfer curve and error bands' }));
}
