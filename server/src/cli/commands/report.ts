// thermoscribe report FILE [--channel NAME] [--root DIR] [--brief]: each channel's summary and its
// sweep as a table (`--brief`: the summary only).
import { channelDynamics, describeFaults, dynamicsLine, sensorFaults } from '../../engine';
import { DiskHost } from '../io';
import { CHANNEL_OPTION, defineVerb, ROOT_OPTION, shown, usageLine, type VerbSpec } from '../verb';
import { formatDiagnostic, table } from '../text';
import { analyseOne } from './check';
import type { ChannelResult } from '../../engine';
import { fixedNumber, formatSI, trimNumber } from '../../engine';
import { cautionFor } from '../../engine';
import { describeBias, describeSensor } from '../../engine';
import { residualReport } from '../residuals';

export const REPORT: VerbSpec = { name: 'report', files: 'one', options: { channel: CHANNEL_OPTION, root: ROOT_OPTION, brief: { kind: 'flag' } } };
export const REPORT_USAGE = usageLine(REPORT);

export const runReport = defineVerb(REPORT, (args, io) => {
  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'string') return { unusable: a };
  const only = args.text('channel');
  const channels = only !== undefined ? a.channels.filter((c) => c.channel.name === only) : a.channels;
  if (only !== undefined && channels.length === 0) {
    return { unusable: `no analysed channel named ${shown(only)}; channels: ${a.channels.map((c) => c.channel.name).join(', ') || '(none)'}` };
  }
  const brief = args.flag('brief');
  for (const r of channels) io.out(channelReport(r, brief) + '\n\n');
  const diags = a.diagnostics;
  if (diags.length) {
    io.out('Diagnostics\n');
    for (const d of diags) io.out('  ' + formatDiagnostic(d, host.index(d.file), io.cwd) + '\n');
    io.out('\n');
  }
  io.out(cautionFor(a.channels.map((r) => r.channel)) + '\n');
  return { diagnostics: diags };
});

/** A channel's summary lines, then (unless `brief`) its sweep as a table. */
export function channelReport(r: ChannelResult, brief = false): string {
  const c = r.channel;
  const s = r.summary;
  const head = [
    `Channel ${c.name}: ${describeSensor(c)}, ${describeBias(c)}`,
    `  ADC '${c.adc.name}': ${c.adc.bits} bits on ${formatSI(c.adc.reference.value, 'V')}, LSB ${formatSI(s.lsbVolts, 'V')}`,
    `  sensed ${formatSI(s.voltsMin, 'V')} .. ${formatSI(s.voltsMax, 'V')}, codes ${s.codeMin} .. ${s.codeMax}, current ${formatSI(s.ampsMin, 'A')} .. ${formatSI(s.ampsMax, 'A')}`,
    `  worst resolution ${trimNumber(s.worst.celsiusPerCount, 3)} °C/count (${trimNumber(s.worst.countsPerKelvin, 3)} counts/K) at ${trimNumber(s.worst.celsius, 4)} °C`,
    `  self-heating up to ${trimNumber(s.selfHeatingMaxK * 1000, 3)} mK; straight-line error: end-point ${trimNumber(s.nonlinearity.endPointK, 3)} K, best fit ${trimNumber(s.nonlinearity.bestFitK, 3)} K`,
    ...describeFaults(sensorFaults(c, s.codeMin, s.codeMax)).map((l) => `  fault: ${l}`),
    ...responseLines(r),
    '',
  ];
  if (brief) return head.join('\n').trimEnd();
  const rows = r.sweep.map((p) => [
    fixedNumber(p.celsius, 2),
    fixedNumber(p.volts * 1000, 3),
    fixedNumber(p.amps * 1e6, 3),
    String(p.code),
    fixedNumber(p.slope * 1000, 4),
    fixedNumber(p.countsPerKelvin, 3),
    fixedNumber(p.celsiusPerCount, 4),
    fixedNumber(p.selfHeatingK * 1000, 3),
  ]);
  return head.join('\n') + table(['°C', 'mV', 'µA', 'code', 'mV/K', 'counts/K', '°C/count', 'heat mK'], rows) + residualReport(r.channel);
}

/** The channel's response (lag at the stated ramp, settling after a step, the chosen filter) when it states its dynamics: the hover's line, in plain text. */
function responseLines(r: ChannelResult): string[] {
  const d = channelDynamics(r);
  return d ? [`  ${dynamicsLine(d).replace(/\*\*/g, '')}`] : [];
}
