// thermoscribe gen FILE [--channel NAME] [--out PATH] [--root DIR] [--prune] [--prefix NAME]
// --prefix goes before every identifier generated (two specs with a same-named channel then link).
// Writes the conversion code of every channel (or one) to PATH (default `<spec-stem>_conversion.c`
// beside the spec) and the header beside it (same stem, `.h`). An existing file has only the
// marked blocks replaced (blocks of channels not in it are added); hand-written code is kept.
// Channels with errors (in their block, their sensor's or their ADC's) or whose code cannot be made
// as asked are left out and named with the reason; the clean ones are still written. Blocks of
// channels the spec no longer has (orphans) are named, and removed only with --prune (which
// removes every block this spec does not define: never prune a file that several specs share).
// Exit status by the one rule of cli/verb.ts: 1 also when a channel was left out, none could be
// generated or a write fails; 2 also for damaged markers in an existing file (an input gen cannot use).
// Both files are planned (and any damaged marker refused) before either is written.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { orphanBlocks, scanGeneratedBlocks, spliceGenerated } from '../../engine';
import { specChannelNames } from '../../engine';
import { conversionFilePath, headerPathFor } from '../../engine';
import { generateForSpec, splitChannels } from '../../engine';
import { prefixProblem } from '../../engine';
import { symbolClash } from '../../engine';
import { filterWords } from '../../engine';
import type { GenerateResult, SpliceBlock } from '../../engine';
import { DiskHost, type CliIO } from '../io';
import { CHANNEL_OPTION, defineVerb, ROOT_OPTION, shown, usageLine, type Outcome, type VerbSpec } from '../verb';
import { writeFilesTogether } from '../write-files';
import { readDisk } from '../../disk';
import { shown as shownText } from '../../engine';
import { analyseOne } from './check';

export const GEN: VerbSpec = {
  name: 'gen',
  files: 'one',
  options: {
    channel: CHANNEL_OPTION,
    out: { kind: 'output', meta: 'PATH.c', suffix: '.c' },
    root: ROOT_OPTION,
    prune: { kind: 'flag' },
    prefix: { kind: 'name', meta: 'NAME' },
  },
};
export const GEN_USAGE = usageLine(GEN);

interface Planned {
  file: string;
  text: string;
  changed: boolean;
  created: boolean;
}

export const runGen = defineVerb(GEN, (args, io): Outcome => {
  const channel = args.text('channel');
  const out = args.text('out');
  const prefix = args.text('prefix');
  const badPrefix = prefix === undefined ? undefined : prefixProblem(prefix);
  if (badPrefix) return { unusable: `--prefix ${badPrefix}` };
  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'string') return { unusable: a };
  if (channel !== undefined && !a.channels.some((r) => r.channel.name === channel) && !specChannelNames(a).has(channel)) {
    return { unusable: `no channel ${shown(channel)} in ${shownText(path.basename(a.path))}; channels: ${[...specChannelNames(a)].join(', ') || '(none)'}` };
  }
  const split = splitChannels(a, channel);
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  // Errors are printed when they left a channel out; otherwise they lie outside what was generated.
  const spec: Outcome = split.leftOut.length > 0 ? { diagnostics: a.diagnostics, unprinted: { index: (f: string) => host.index(f) } } : {};
  if (split.leftOut.length === 0 && errors.length > 0) io.err(`thermoscribe gen: note: the spec has ${errors.length} error${errors.length === 1 ? '' : 's'} outside the channels generated (run check)\n`);
  const cPath = out !== undefined ? path.resolve(io.cwd, out) : conversionFilePath(a.path);
  const hPath = headerPathFor(cPath);
  const stem = path.basename(cPath, '.c');
  const gen = split.clean.length > 0 ? generateForSpec({ path: a.path, channels: split.clean }, { fileStem: stem, prefix }) : undefined;
  const leftOut = [...split.leftOut, ...(gen?.leftOut ?? [])];
  for (const l of leftOut) io.err(`thermoscribe gen: left out '${l.channel}': ${l.why}\n`);
  if (!gen || !gen.ok) return { ...spec, failed: `${gen && !gen.ok ? `${gen.message}; ` : ''}no channel could be generated (nothing was written)` };
  for (const [file, result] of [[cPath, gen.source], [hPath, gen.header]] as const) {
    const existing = readDisk(file);
    const clash = existing !== undefined ? symbolClash(existing, result.channels.map((ch, i) => ({ channel: gen.inputs[i]!.channelName, identifier: ch.identifier }))) : undefined;
    if (clash) return { ...spec, failed: `${rel(io, file)}: ${clash} (nothing was written)` };
  }
  const prune = args.flag('prune');
  const names = specChannelNames(a);
  const plans: Planned[] = [];
  const orphans: string[] = [];
  for (const [file, result, header] of [[cPath, gen.source, false], [hPath, gen.header, true]] as const) {
    const p = plan(file, result, header, gen.inputs.map((i) => i.channelName), gen.inputs.map((i) => i.specHash), names, prune, orphans);
    // Damaged markers in an existing file: an input gen cannot use (2); a file it cannot read: 1.
    if (typeof p === 'string') return { unusable: `${p} (nothing was written)` };
    if ('unreadable' in p) return { ...spec, failed: `${p.unreadable} (nothing was written)` };
    plans.push(p);
  }
  // Both files or neither (cli/write-files.ts): the old pair stays on any failure.
  const failed = writeFilesTogether(plans.filter((p) => p.changed));
  if (failed) return { ...spec, failed: `${failed} (nothing was changed)` };
  for (const [i, ch] of gen.source.channels.entries()) {
    const input = gen.inputs[i]!;
    io.out(`${input.channelName}: ${ch.method}, ${ch.entries} ${ch.method === 'table' ? 'points' : 'segments'}, max error ${ch.maxErrorC.toFixed(4)} °C over ${ch.rangeText} (${input.method === 'line' ? 'straight line: conversion = line, not held to code_error' : `target ${input.errorTarget} °C`}), about ${ch.bytesEstimate} bytes linked on an 8-bit AVR, ${ch.bytesEstimateM0} on a Cortex-M0${'filter' in input && input.filter ? `; firmware filter: ${filterWords(input.filter)} (${ch.identifier}_filter_update)` : ''}\n`);
  }
  for (const p of plans) io.out(`${p.changed ? (p.created ? 'created' : 'updated') : 'unchanged'} ${rel(io, p.file)}\n`);
  for (const o of orphans) io.out(prune ? `removed ${o}\n` : `orphan ${o}: no channel of this name in the spec; remove it with --prune\n`);
  if (leftOut.length > 0) io.out(`left out ${leftOut.length} channel${leftOut.length === 1 ? '' : 's'}: ${leftOut.map((l) => l.channel).join(', ')} (reasons above)\n`);
  io.out('Caution: generated from a design model; verify the channel against a calibrated reference before relying on it (see the file header).\n');
  return leftOut.length > 0 ? { ...spec, failed: `left out ${leftOut.length} channel${leftOut.length === 1 ? '' : 's'}` } : spec;
});

/** The new text of one file, or why it cannot be written. */
function plan(file: string, result: GenerateResult, header: boolean, names: string[], hashes: string[], specNames: ReadonlySet<string>, prune: boolean, orphans: string[]): Planned | { unreadable: string } | string {
  let existing: string | undefined;
  try {
    existing = fs.existsSync(file) ? fs.readFileSync(file, 'utf8') : undefined;
  } catch (err) {
    return { unreadable: `cannot read ${file}: ${err instanceof Error ? err.message : String(err)}` };
  }
  if (existing === undefined) return { file, text: result.text, changed: true, created: true };
  const blocks: SpliceBlock[] = result.channels.map((ch, i) => ({ channel: names[i]!, hash: hashes[i]!, text: ch.code }));
  const scan = scanGeneratedBlocks(existing);
  const problem = scan.problems[0];
  if (problem) return `${file}: ${problem.message} (at line ${lineOf(existing, problem.offset)}); repair or remove the markers by hand`;
  // In a header, blocks of channels new to it go inside the include guard and extern "C": before
  // the generator's own closing lines when they are still there.
  const present = new Set(scan.blocks.map((b) => b.channel));
  const tail = header && blocks.some((b) => !present.has(b.channel)) ? existing.search(/#ifdef __cplusplus\r?\n\}\r?\n#endif\r?\n#endif[^\r\n]*(?:\r?\n[ \t]*)*$/) : -1;
  const head = tail > 0 ? existing.slice(0, tail) : existing;
  const spliced = spliceGenerated(head, blocks);
  if (!spliced.ok) return `${file}: ${spliced.message}`;
  const orphan = orphanBlocks(spliced.text, specNames, prune);
  for (const b of orphan.orphans) orphans.push(`block '${b.channel}' in ${path.basename(file)}`);
  let text = orphan.text;
  if (tail > 0) {
    const eol = /\r\n/.test(existing) ? '\r\n' : '\n';
    text = (text.endsWith(eol + eol) ? text : text + eol) + existing.slice(tail);
  }
  return { file, text, changed: text !== existing, created: false };
}

function lineOf(text: string, offset: number): number {
  let n = 1;
  for (let i = 0; i < offset && i < text.length; i++) if (text.charCodeAt(i) === 10) n++;
  return n;
}

function rel(io: CliIO, file: string): string {
  return path.relative(io.cwd, file) || file;
}
