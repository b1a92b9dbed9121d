// Inlay hints: a computed figure at the end of the lines that matter. After a channel's bias: the
// current range it gives; after its range: the worst-case resolution; after its adc: the sensed
// span against the reference; after its accuracy: self-heating and straight-line error; after an
// ADC's reference: the LSB size; after its bits: the number of codes.
import type { Analysis } from '../analysis/result';
import type { BlockNode, Span } from '../syntax/ast';
import { blockSpec, fieldSpec } from '../model/schema';
import { spanOf } from '../model/read-value';
import * as f from '../analysis/figures';

export interface InlayHint {
  /** Offset the hint is shown at (the end of the field's value). */
  offset: number;
  label: string;
  tooltip?: string;
}

export function inlayHints(a: Analysis, range?: Span): InlayHint[] {
  const tree = a.files[0]?.parse.tree;
  if (!tree) return [];
  const out: InlayHint[] = [];
  for (const item of tree.items) {
    if (item.kind !== 'block') continue;
    if (range && (item.span.end < range.start || item.span.start > range.end)) continue;
    const spec = blockSpec(item.keyword.text);
    if (spec?.kind === 'channel') channelHints(a, item, out);
    else if (spec?.kind === 'adc') adcHints(a, item, out);
  }
  return range ? out.filter((h) => h.offset >= range.start && h.offset <= range.end) : out;
}

/** End offset of each written field's value, by canonical field name. */
function valueEnds(block: BlockNode): Map<string, number> {
  const spec = blockSpec(block.keyword.text)!;
  const ends = new Map<string, number>();
  for (const fl of block.fields) {
    if (fl.kind !== 'field' || fl.value.length === 0) continue;
    const fs = fieldSpec(spec, fl.key.text);
    if (fs && !ends.has(fs.name)) ends.set(fs.name, spanOf(fl.value).end);
  }
  return ends;
}

function channelHints(a: Analysis, block: BlockNode, out: InlayHint[]): void {
  const r = f.channelResult(a, block.name.text);
  if (!r) return;
  const s = r.summary;
  const ends = valueEnds(block);
  const at = (field: string, label: string, tooltip?: string) => {
    const offset = ends.get(field);
    if (offset !== undefined) out.push({ offset, label, ...(tooltip ? { tooltip } : {}) });
  };
  at('bias', `→ ${f.ampsSpan(s.ampsMin, s.ampsMax)}`, 'Bias current over the range (nominal values)');
  // Where the signal clips, a resolution means nothing: say where it clips instead.
  const clip = f.clipText(r);
  if (clip) at('range', clip, 'The sensed voltage leaves the ADC input span over this part of the range');
  else at('range', `worst ${f.perCount(s.worst.celsiusPerCount)} at ${f.celsius(s.worst.celsius)}`, 'Coarsest resolution over the range');
  at('adc', `${f.volts(s.voltsMin)} .. ${f.volts(s.voltsMax)} of ${f.reference(r.channel.adc.reference.value)}`, 'Sensed voltage over the range against the ADC reference');
  // The straight-line error matters only to a channel converted with a line.
  if (r.channel.conversion === 'line') at('accuracy', `self-heating ${f.rise(s.selfHeatingMaxK)}, line error ${f.kelvinDelta(s.nonlinearity.bestFitK)}`, 'Largest self-heating and best-fit straight-line error over the range');
  else at('accuracy', `self-heating ${f.rise(s.selfHeatingMaxK)}`, 'Largest self-heating over the range');
}

function adcHints(a: Analysis, block: BlockNode, out: InlayHint[]): void {
  const adc = a.model.adcs.get(block.name.text);
  if (!adc || adc.file !== a.path) return;
  const ends = valueEnds(block);
  const ref = ends.get('reference');
  if (ref !== undefined) out.push({ offset: ref, label: `LSB ${f.volts(adc.reference.value / 2 ** adc.bits)}`, tooltip: 'Reference / 2^bits' });
  const bits = ends.get('bits');
  if (bits !== undefined) out.push({ offset: bits, label: `${2 ** adc.bits} codes` });
}
