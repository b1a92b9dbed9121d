// thermoscribe report FILE [--channel NAME] [--root DIR]: each channel's sweep as a table.
import { describeFaults, sensorFaults } from '../../sensors/faults';
import { parseArgs } from '../args';
import { DiskHost, EXIT, type CliIO } from '../io';
import { formatDiagnostic, table } from '../text';
import { analyseOne } from './check';
import type { ChannelResult } from '../../analysis/types';
import { formatSI, trimNumber } from '../../model/read-value';
import { CAUTION } from '../../report/caution';
import { describeBias, describeSensor } from '../../report/describe';

export const REPORT_USAGE = 'thermoscribe report FILE [--channel NAME] [--root DIR]';

export function runReport(argv: string[], io: CliIO): number {
  const args = parseArgs(argv, ['channel', 'root']);
  if (typeof args === 'string' || args.positional.length !== 1) {
    io.err(`thermoscribe report: ${typeof args === 'string' ? args : 'name exactly one .tsense file'}\nusage: ${REPORT_USAGE}\n`);
    return EXIT.unusable;
  }
  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'number') return a;
  const only = args.options.get('channel');
  const channels = typeof only === 'string' ? a.channels.filter((c) => c.channel.name === only) : a.channels;
  if (typeof only === 'string' && channels.length === 0) {
    io.err(`thermoscribe report: no analysed channel named '${only}'; channels: ${a.channels.map((c) => c.channel.name).join(', ') || '(none)'}\n`);
    return EXIT.unusable;
  }
  for (const r of channels) io.out(channelReport(r) + '\n\n');
  const diags = a.diagnostics;
  if (diags.length) {
    io.out('Diagnostics\n');
    for (const d of diags) io.out('  ' + formatDiagnostic(d, host.index(d.file), io.cwd) + '\n');
    io.out('\n');
  }
  io.out(CAUTION + '\n');
  return diags.some((d) => d.severity === 'error') ? EXIT.errors : EXIT.clean;
}

export function channelReport(r: ChannelResult): string {
  const c = r.channel;
  const s = r.summary;
  const head = [
    `Channel ${c.name}: ${describeSensor(c)}, ${describeBias(c)}`,
    `  ADC '${c.adc.name}': ${c.adc.bits} bits on ${formatSI(c.adc.reference.value, 'V')}, LSB ${formatSI(s.lsbVolts, 'V')}`,
    `  sensed ${formatSI(s.voltsMin, 'V')} .. ${formatSI(s.voltsMax, 'V')}, codes ${s.codeMin} .. ${s.codeMax}, current ${formatSI(s.ampsMin, 'A')} .. ${formatSI(s.ampsMax, 'A')}`,
    `  worst resolution ${trimNumber(s.worst.celsiusPerCount, 3)} °C/count (${trimNumber(s.worst.countsPerKelvin, 3)} counts/K) at ${trimNumber(s.worst.celsius, 4)} °C`,
    `  self-heating up to ${trimNumber(s.selfHeatingMaxK * 1000, 3)} mK; straight-line error: end-point ${trimNumber(s.nonlinearity.endPointK, 3)} K, best fit ${trimNumber(s.nonlinearity.bestFitK, 3)} K`,
    ...describeFaults(sensorFaults(c, s.codeMin, s.codeMax)).map((l) => `  fault: ${l}`),
    '',
  ];
  const rows = r.sweep.map((p) => [
    p.celsius.toFixed(2),
    (p.volts * 1000).toFixed(3),
    (p.amps * 1e6).toFixed(3),
    String(p.code),
    (p.slope * 1000).toFixed(4),
    p.countsPerKelvin.toFixed(3),
    p.celsiusPerCount.toFixed(4),
    (p.selfHeatingK * 1000).toFixed(3),
  ]);
  return head.join('\n') + table(['°C', 'mV', 'µA', 'code', 'mV/K', 'counts/K', '°C/count', 'heat mK'], rows);
}
