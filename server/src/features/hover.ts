// Hover: computed figures for a channel, its bias, a junction or an ADC; a number's value in
// base units; a field's documentation and default. Offsets in, markdown and a span out.
import { describeFaults, sensorFaults } from '../analysis/sensor-faults';
import type { Analysis } from '../analysis/result';
import type { ChannelResult, SweepPoint } from '../analysis/types';
import type { AdcDef } from '../model/types';
import type { BlockNode, FieldNode, QuantityTerm, Span } from '../syntax/ast';
import { blockSpec, fieldSpec, type BlockKind } from '../model/schema';
import { needOf } from '../model/language';
import { DiagnosticSink } from '../diagnostics/diagnostic';
import { readQuantityValue } from '../model/read-value';
import { readUnit, type Dimension } from '../model/units';
import { pointAt } from '../analysis/sweep';
import { describeBias } from '../report/describe';
import { ZERO_CELSIUS_K } from '../physics/constants';
import { locate, type Located } from './locate';
import * as f from '../analysis/figures';
import { channelDynamics, dynamicsLine } from '../analysis/dynamics';
import { describeSetting } from '../budget/describe';
import { kindOf, sensorKind } from '../sensors/registry';
import { OUTLIER_RULE, residualRows } from '../calibration/fit';
import { escapeControls, shown } from '../diagnostics/shown';

export interface HoverResult {
  markdown: string;
  span: Span;
}

const ROOM_K = 25 + ZERO_CELSIUS_K;
const SHORT_CAUTION = '_Model figures, not a safety assessment: verify the built channel against a calibrated reference thermometer._';

export interface HoverOptions {
  /** A link (markdown target) that opens a channel's plot panel, where its error budget tables are. */
  plotLink?: (channel: string) => string;
}

export function hover(a: Analysis, offset: number, o: HoverOptions = {}): HoverResult | null {
  const tree = a.files[0]?.parse.tree;
  if (!tree) return null;
  const at = locate(tree, offset);
  if (!at) return null;
  switch (at.kind) {
    case 'use':
      return { markdown: useHover(a, at.node.path.text), span: at.node.path.span };
    case 'block-keyword':
    case 'block-name': {
      const span = at.kind === 'block-name' ? at.block.name.span : at.block.keyword.span;
      const md = blockHover(a, at.block, o);
      return md ? { markdown: md, span } : null;
    }
    case 'field-key': {
      const md = fieldDocHover(at.block, at.field);
      return md ? { markdown: md, span: at.field.key.span } : null;
    }
    case 'term':
      return termHover(a, at);
  }
}

function useHover(a: Analysis, rel: string): string {
  const used = a.files[0]!.uses.find((u) => u.node.path.text === rel);
  const file = used?.target ? a.files.find((x) => x.path === used.target) : undefined;
  if (!file) return `\`use "${rel}"\`: not loaded`;
  const names = file.parse.tree.items.filter((i): i is BlockNode => i.kind === 'block').map((b) => `${b.keyword.text} \`${b.name.text}\``);
  return `**${rel}** brings in ${names.length ? names.join(', ') : 'no definitions'}`;
}

function blockHover(a: Analysis, block: BlockNode, o: HoverOptions): string | null {
  const spec = blockSpec(block.keyword.text);
  if (!spec) return null;
  const name = block.name.text;
  if (spec.kind === 'channel') {
    const r = f.channelResult(a, name);
    return r ? channelHover(r, o) : `**channel ${name}**\n\n${spec.doc}\n\nNo figures: the channel has errors (see the problems list).`;
  }
  const kind = sensorKind(spec.kind);
  if (kind) {
    const s = a.model.sensors.get(name);
    return s ? kind.hover(a, s) : `**${spec.kind} ${name}**\n\n${spec.doc}\n\nNo figures: the definition has errors.`;
  }
  const adc = a.model.adcs.get(name);
  return adc ? adcHover(a, adc) : `**adc ${name}**\n\n${spec.doc}\n\nNo figures: the definition has errors.`;
}

function biasText(r: ChannelResult): string {
  return describeBias(r.channel);
}

/** Low end, 25 °C (when inside the range) and high end of a channel. */
function keyPoints(r: ChannelResult): { low: SweepPoint; room: SweepPoint | null; high: SweepPoint } {
  const c = r.channel;
  const low = r.sweep[0]!;
  const high = r.sweep[r.sweep.length - 1]!;
  const room = ROOM_K >= c.lowK && ROOM_K <= c.highK ? pointAt(c, ROOM_K) : null;
  return { low, room, high };
}

function pointTable(r: ChannelResult, rows: ('amps' | 'volts' | 'slope' | 'counts' | 'perCount' | 'heat')[]): string {
  const { low, room, high } = keyPoints(r);
  const pts = room ? [low, room, high] : [low, high];
  const worst = r.summary.worst;
  const isWorst = (p: SweepPoint) => p.kelvin === worst.kelvin;
  const head = `| | ${pts.map((p) => f.celsius(p.celsius)).join(' | ')} |\n|---|${pts.map(() => '---:').join('|')}|`;
  const line = (label: string, cell: (p: SweepPoint) => string) => `| ${label} | ${pts.map(cell).join(' | ')} |`;
  const out = [head];
  for (const row of rows) {
    if (row === 'amps') out.push(line('bias current', (p) => f.amps(p.amps)));
    if (row === 'volts') out.push(line('sensed voltage', (p) => f.volts(p.volts)));
    if (row === 'slope') out.push(line('slope', (p) => f.slopeMv(p.slope)));
    if (row === 'counts') out.push(line('counts per kelvin', (p) => f.trimNumber(p.countsPerKelvin, 3)));
    if (row === 'perCount') out.push(line('°C per count', (p) => f.trimNumber(p.celsiusPerCount, 3) + (isWorst(p) ? ' ◀ worst' : '')));
    if (row === 'heat') out.push(line('self-heating', (p) => f.rise(p.selfHeatingK)));
  }
  return out.join('\n');
}

/**
 * A channel's hover: a short summary first (current, voltage, slope, worst resolution, worst-case
 * error), a link to the plot panel (which holds the error budget tables), then the details.
 */
export function channelHover(r: ChannelResult, o: HoverOptions = {}): string {
  const c = r.channel;
  const s = r.summary;
  const vref = c.adc.reference.value;
  const nl = s.nonlinearity;
  const slopes = r.sweep.map((p) => p.slope).filter(Number.isFinite);
  const clip = f.clipText(r);
  const b = r.worstCaseBudget?.stated;
  const summary = [
    `- Current: ${f.ampsSpan(s.ampsMin, s.ampsMax)}`,
    `- Voltage: ${f.volts(s.voltsMin)} .. ${f.volts(s.voltsMax)} of the ${f.reference(vref)} reference, codes ${s.codeMin} .. ${s.codeMax}${clip ? ` — **${clip}**` : ''}`,
    `- Slope: ${slopes.length ? `${f.slopeMv(Math.min(...slopes))} .. ${f.slopeMv(Math.max(...slopes))}` : 'n/a'}`,
    `- Worst resolution: ${worstText(r, clip !== null)}` + (c.resolutionKPerCount !== null ? ` (required ${f.perCount(c.resolutionKPerCount)})` : ''),
    `- Worst-case error: ${b ? `**±${f.kelvinDelta(b.worstAbsK)}** at ${f.celsius(b.worstAtCelsius)} with ${describeSetting(b.setting)}${c.accuracyK !== null ? ` (target ±${f.kelvinDelta(c.accuracyK)}: ${b.worstAbsK <= c.accuracyK ? 'met' : 'missed'})` : ''}${b.dominant ? `; mostly ${b.dominant.label}` : ''}` : 'not computed (see the problems list)'}`,
  ].join('\n');
  return [
    `**channel ${c.name}**: ${c.sensor.kind} \`${c.sensor.name}\` (${c.sensor.params.kind}), ${biasText(r)}, ADC \`${c.adc.name}\` (${c.adc.bits} bits on ${f.reference(vref)})`,
    summary,
    o.plotLink ? `[Plots and error budget tables](${o.plotLink(c.name)})` : 'Plots and error budget tables: the channel\'s "Show plots" lens.',
    '---',
    ...(kindOf(c.sensor).channelHoverLines?.(r) ?? []),
    pointTable(r, ['amps', 'volts', 'slope', 'counts', 'perCount']),
    `Sensor faults (what the ADC reads):\n${describeFaults(sensorFaults(c, s.codeMin, s.codeMax)).map((l) => `- ${l}`).join('\n')}`,
    `Self-heating: up to ${f.rise(s.selfHeatingMaxK)} (θJA ${f.trimNumber(c.thetaJA, 4)} K/W)`,
    c.conversion === 'line'
      ? `Straight-line conversion error: end-point ${f.kelvinDelta(nl.endPointK)}, best fit ${f.kelvinDelta(nl.bestFitK)}` + (c.accuracyK !== null ? `; accuracy target ±${f.kelvinDelta(c.accuracyK)}` : '')
      : `A straight line instead of the table would be off by ${f.kelvinDelta(nl.bestFitK)} (best fit)`,
    ...(c.dynamics ? [dynamicsLine(channelDynamics(r)!)] : []),
    SHORT_CAUTION,
    ...(kindOf(c.sensor).cautions ?? []),
  ].join('\n\n');
}

/** The worst resolution; where the signal clips the code does not move, so only the rest counts. */
function worstText(r: ChannelResult, clips: boolean): string {
  if (!clips) return `**${f.perCount(r.summary.worst.celsiusPerCount)}** at ${f.celsius(r.summary.worst.celsius)}`;
  const vref = r.channel.adc.reference.value;
  const inside = r.sweep.filter((p) => p.volts >= 0 && p.volts < vref);
  if (inside.length === 0) return 'none: the signal clips over the whole range';
  const w = inside.reduce((m, p) => (p.celsiusPerCount > m.celsiusPerCount ? p : m));
  return `none where the signal clips; **${f.perCount(w.celsiusPerCount)}** at ${f.celsius(w.celsius)} over the rest`;
}

export function biasHover(r: ChannelResult): string {
  const c = r.channel;
  const s = r.summary;
  const b = c.bias;
  const tol = b.kind === 'current'
    ? (b.amps.tolerance ? `current ± ${f.percent(b.amps.tolerance)}` : '')
    : [b.ohms.tolerance ? `resistor ± ${f.percent(b.ohms.tolerance)}` : '', b.supply.tolerance ? `supply ± ${f.percent(b.supply.tolerance)}` : ''].filter(Boolean).join(', ');
  return [
    `**bias of ${c.name}**: ${biasText(r)}${tol ? ` (${tol}; figures at nominal values)` : ''}`,
    pointTable(r, ['amps', 'volts', 'heat']),
    ...(kindOf(c.sensor).biasHoverLines?.(r) ?? []),
    `Self-heating: up to ${f.rise(s.selfHeatingMaxK)}`,
  ].join('\n\n');
}

function adcHover(a: Analysis, adc: AdcDef): string {
  const vref = adc.reference.value;
  const lsb = vref / 2 ** adc.bits;
  const lines = f.channelsUsing(a, adc.name, 'adc').map((r) => {
    const s = r.summary;
    return `- \`${r.channel.name}\`: ${f.volts(s.voltsMin)} .. ${f.volts(s.voltsMax)} (${f.percent((s.voltsMax - s.voltsMin) / vref)} of the reference), codes ${s.codeMin} .. ${s.codeMax}, worst ${f.perCount(s.worst.celsiusPerCount)}`;
  });
  return [
    `**adc ${adc.name}**: ${adc.bits} bits, reference ${f.reference(vref)}${adc.reference.tolerance ? ` ± ${f.percent(adc.reference.tolerance)}` : ''}`,
    `LSB ${f.volts(lsb)}; ${2 ** adc.bits} codes; ${f.trimNumber(2 ** adc.bits / vref / 1000, 4)} counts per mV`,
    (adc.maxSourceOhms !== null ? `Source impedance at most ${f.ohms(adc.maxSourceOhms)}` : 'Source impedance unchecked') +
      (adc.sampleFarads !== null ? `; sampling capacitance ${f.formatSI(adc.sampleFarads, 'F')}` : ''),
    lines.length ? `Channels on this ADC:\n${lines.join('\n')}` : 'No channel in this file reads this ADC',
  ].join('\n\n');
}

function fieldDocHover(block: BlockNode, field: FieldNode): string | null {
  const spec = blockSpec(block.keyword.text);
  const fs = spec ? fieldSpec(spec, field.key.text) : undefined;
  if (!spec || !fs) return null;
  return fieldDoc(spec.kind, fs.name);
}

/** Documentation of a field from the schema: doc, default and an example. */
export function fieldDoc(kind: BlockKind, name: string): string {
  const fs = blockSpec(kind)!.fields.find((x) => x.name === name)!;
  const alias = fs.aliases?.length ? ` (also ${fs.aliases.join(', ')})` : '';
  return [
    `**${fs.name}**${alias}, in ${kind}`,
    fs.doc,
    fs.defaultText !== undefined ? `Default: \`${fs.defaultText}\`` : needOf(fs).need === 'required' ? 'Required.' : 'Optional: unchecked when absent.',
    `Example: \`${fs.example}\``,
  ].join('\n\n');
}

function termHover(a: Analysis, at: Extract<Located, { kind: 'term' }>): HoverResult | null {
  const { block, field, term, quantity } = at;
  const kind = blockSpec(block.keyword.text)?.kind;
  const key = kind ? fieldSpec(blockSpec(kind)!, field.key.text)?.name : undefined;
  const r = kind === 'channel' ? f.channelResult(a, block.name.text) : undefined;
  // A reference to a sensor or an ADC: that definition's figures.
  if (term.kind === 'word' && kind === 'channel' && (key === 'sensor' || key === 'adc')) {
    const s = key === 'sensor' ? a.model.sensors.get(term.text) : undefined;
    const adc = key === 'adc' ? a.model.adcs.get(term.text) : undefined;
    if (s) return { markdown: kindOf(s).hover(a, s), span: term.span };
    if (adc) return { markdown: adcHover(a, adc), span: term.span };
    return null;
  }
  if (term.kind === 'string' && kind === 'channel' && key === 'bench_data') return r ? { markdown: benchHover(r), span: term.span } : null;
  const biasPart = key === 'bias' && r ? biasHover(r) : null;
  if (quantity && kind && key) {
    const meaning = quantityMeaning(kind, key, field, at.index, quantity);
    const value = meaning ? valueText(quantity, meaning) : null;
    if (value) return { markdown: biasPart ? `${value}\n\n---\n\n${biasPart}` : value, span: quantity.span };
  }
  if (biasPart) return { markdown: biasPart, span: term.span };
  return null;
}

interface Meaning {
  dimension: Dimension;
  difference: boolean;
}

/** The dimension a quantity has in its place: field form, bias slot, tolerance or resolution. */
function quantityMeaning(kind: BlockKind, key: string, field: FieldNode, index: number, q: QuantityTerm): Meaning | null {
  const u = q.unit ? readUnit(q.unit.text) : null;
  if (u && typeof u !== 'string' && u.dimension === 'ratio') return { dimension: 'ratio', difference: false };
  const isTolerance = field.value.some((t) => (t.kind === 'quantity' && t.tolerance === q) || (t.kind === 'tolerance' && t.amount === q));
  const fs = blockSpec(kind)?.fields.find((x) => x.name === key);
  if (!fs) return null;
  const form = fs.form;
  switch (form.form) {
    case 'quantity':
      return { dimension: form.dimension, difference: (form.difference ?? false) || isTolerance };
    case 'range':
      return { dimension: form.dimension, difference: isTolerance };
    case 'accuracy':
      return { dimension: 'temperature', difference: true };
    case 'resolution': {
      const next = field.value[index + 2];
      return next && (next.kind === 'word' || next.kind === 'unit') && /count|LSB/.test(next.text) ? { dimension: 'temperature', difference: true } : { dimension: 'count', difference: false };
    }
    case 'bias': {
      const head = field.value[0];
      if (head?.kind === 'word' && head.text === 'current') return { dimension: 'current', difference: false };
      return { dimension: index >= 3 ? 'voltage' : 'resistance', difference: false };
    }
    default:
      return null;
  }
}

const BASE_UNIT: Record<Dimension, string> = {
  voltage: 'V', current: 'A', resistance: 'Ω', capacitance: 'F', temperature: 'K', energy: 'eV', power: 'W',
  'thermal-resistance': 'K/W', ratio: '', count: 'counts', time: 's', 'temperature-rate': 'K/s', dimensionless: '',
};

function valueText(q: QuantityTerm, m: Meaning): string | null {
  const sink = new DiagnosticSink();
  const written = q.number.text + (q.unit ? (q.unit.span.start === q.number.span.end ? '' : ' ') + q.unit.text : '');
  if (m.dimension === 'ratio') {
    const u = q.unit ? readUnit(q.unit.text) : null;
    const scale = u && typeof u !== 'string' ? u.scale : 1;
    return `\`${written}\` = ${f.trimNumber(q.number.value * scale, 6)} (relative)`;
  }
  const v = readQuantityValue(q, m.dimension, { file: '', sink, field: 'value' }, m.difference);
  if (v === null) return sink.items[0] ? `\`${written}\`: ${sink.items[0].message.replace(/^value: /, '')}` : null;
  const unit = BASE_UNIT[m.dimension];
  const plain = `${baseNumber(v)}${unit ? ' ' + unit : ''}`;
  if (m.dimension === 'temperature') {
    return m.difference ? `\`${written}\` = ${plain} (a temperature difference)` : `\`${written}\` = ${plain} = ${f.kelvinToCelsius(v)}`;
  }
  const pretty = unit && unit !== 'counts' && unit !== 'K/W' && unit !== 'eV' ? f.formatSI(v, unit) : plain;
  return pretty === plain ? `\`${written}\` = ${plain}` : `\`${written}\` = ${plain} = ${pretty}`;
}

/** A base-unit number: plain for moderate magnitudes, exponent form (1e-4) otherwise. */
function baseNumber(v: number): string {
  const abs = Math.abs(v);
  if (v === 0 || !Number.isFinite(v) || (abs >= 1e-3 && abs < 1e7) || abs >= 1e100) return f.trimNumber(v, 6);
  return Number(v.toPrecision(6)).toExponential().replace('e+', 'e');
}

/** Rows of the residual table a hover shows; the rest are in `thermoscribe report`. */
const HOVER_RESIDUAL_ROWS = 40;

/** Hover on a channel's bench data path: what was read, the fit, and each point's residual. */
export function benchHover(r: ChannelResult): string {
  const c = r.channel;
  const info = c.benchInfo;
  const name = shown(c.benchData?.path ?? '');
  if (!info) return `**${name}**: not read (see the problem reported here)`;
  const used = c.measured?.filter((m) => m.row !== undefined).length ?? 0;
  const head = [
    `**${name}**: ${used} reading${used === 1 ? '' : 's'} used of ${info.rows} row${info.rows === 1 ? '' : 's'}` +
      (info.skipped ? `, ${info.skipped} left out (see the warnings)` : '') +
      (info.otherBoards ? `, ${info.otherBoards} of other boards` : '') +
      (info.boards.length ? `; board${info.boards.length === 1 ? '' : 's'} ${info.boards.slice(0, 8).map((b) => escapeControls(b)).join(', ')}${info.boards.length > 8 ? ', …' : ''}` : ''),
  ];
  const res = residualRows(c);
  if (!res) return `${head[0]}\n\nThe points are not fitted on a ${c.sensor.kind} channel.`;
  const { fit, rows } = res;
  head.push(`Fit: ${Object.entries(fit.parameters).map(([k, v]) => `${k} = ${f.trimNumber(v, 5)}`).join(', ')}; rms residual ${f.kelvinDelta(fit.rmsK)}` + (fit.outlier !== null ? `; one point flagged (${rows[fit.outlier]!.source}) and left out of the fit the budget and the generated code use` : ''));
  const table = ['| point | °C | code | residual | others\' fit | |', '|---|---:|---:|---:|---:|---|'];
  for (const row of rows.slice(0, HOVER_RESIDUAL_ROWS)) {
    table.push(`| ${escapeControls(row.source).replace(/\|/g, '\\|')} | ${row.celsius.toFixed(2)} | ${row.code} | ${row.residualK.toFixed(3)} K | ${row.leaveOneOutK === null ? '–' : `${row.leaveOneOutK.toFixed(3)} K`} | ${row.outlier ? '**outlier**' : ''} |`);
  }
  if (rows.length > HOVER_RESIDUAL_ROWS) table.push(`| … ${rows.length - HOVER_RESIDUAL_ROWS} more (\`thermoscribe report\` lists all) | | | | | |`);
  return [...head, table.join('\n'), `_Residual: the temperature the fitted model gives for the code minus the reference temperature. Outliers: ${OUTLIER_RULE}._`, SHORT_CAUTION].join('\n\n');
}
