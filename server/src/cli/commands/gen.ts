// thermoscribe gen FILE [--channel NAME] [--out PATH] [--root DIR]
// Writes the conversion code of every channel (or one) to PATH (default `<spec-stem>_conversion.c`
// beside the spec) and the header beside it (same stem, `.h`). An existing file has only the
// marked blocks replaced (blocks of channels not in it are added); hand-written code is kept.
// Exit 0 when written, 1 when the spec has errors or a channel's code cannot be made as asked,
// 2 when an input is unusable (bad arguments, unreadable spec, damaged markers, a write failing).
// Both files are planned (and any damaged marker refused) before either is written.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { scanGeneratedBlocks, spliceGenerated } from '../../codegen/markers';
import { conversionFilePath, headerPathFor } from '../../codegen/channel-input';
import { generateForSpec } from '../../codegen/spec';
import { symbolClash } from '../../codegen/clash';
import type { GenerateResult, SpliceBlock } from '../../codegen/types';
import { parseArgs } from '../args';
import { DiskHost, EXIT, type CliIO } from '../io';
import { formatDiagnostic } from '../text';
import { writeFilesTogether } from '../write-files';
import { readDisk } from '../../disk';
import { shown } from '../../checks/shown';
import { loadAnalyses } from './check';

export const GEN_USAGE = 'thermoscribe gen FILE [--channel NAME] [--out PATH.c] [--root DIR]';

interface Planned {
  file: string;
  text: string;
  changed: boolean;
  created: boolean;
}

export function runGen(argv: string[], io: CliIO): number {
  const args = parseArgs(argv, ['channel', 'out', 'root']);
  if (typeof args === 'string') return usage(io, args);
  if (args.positional.length !== 1) return usage(io, 'name exactly one .tsense file');
  const channel = args.options.get('channel');
  const out = args.options.get('out');
  const root = args.options.get('root');
  if (channel === true || out === true || root === true) return usage(io, 'options --channel, --out and --root need a value');
  if (out !== undefined && !/\.c$/.test(out)) return usage(io, `--out names the C source file and must end in .c (got '${out}'); the header is written beside it with .h`);
  const host = new DiskHost();
  const analyses = loadAnalyses(args.positional, root, io, host);
  if (typeof analyses === 'string') {
    io.err(`thermoscribe: ${analyses}\n`);
    return EXIT.unusable;
  }
  const a = analyses[0]!;
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length > 0) {
    for (const d of errors) io.err(formatDiagnostic(d, host.index(d.file), io.cwd) + '\n');
    io.err(`thermoscribe gen: the spec has ${errors.length} error${errors.length === 1 ? '' : 's'}; fix them first (nothing was written)\n`);
    return EXIT.errors;
  }
  if (channel !== undefined && !a.channels.some((r) => r.channel.name === channel)) {
    io.err(`thermoscribe gen: no channel '${shown(channel)}' in ${shown(path.basename(a.path))}; channels: ${a.channels.map((r) => r.channel.name).join(', ') || '(none)'}\n`);
    return EXIT.unusable;
  }
  const cPath = out !== undefined ? path.resolve(io.cwd, out) : conversionFilePath(a.path);
  const hPath = headerPathFor(cPath);
  const stem = path.basename(cPath, '.c');
  const gen = generateForSpec(a, { channel, fileStem: stem });
  if (!gen.ok) {
    io.err(`thermoscribe gen: ${gen.message} (nothing was written)\n`);
    return EXIT.errors;
  }
  for (const [file, result] of [[cPath, gen.source], [hPath, gen.header]] as const) {
    const existing = readDisk(file);
    const clash = existing !== undefined ? symbolClash(existing, result.channels.map((ch, i) => ({ channel: gen.inputs[i]!.channelName, identifier: ch.identifier }))) : undefined;
    if (clash) {
      io.err(`thermoscribe gen: ${rel(io, file)}: ${clash} (nothing was written)\n`);
      return EXIT.errors;
    }
  }
  const plans: Planned[] = [];
  for (const [file, result, header] of [[cPath, gen.source, false], [hPath, gen.header, true]] as const) {
    const p = plan(file, result, header, gen.inputs.map((i) => i.channelName), gen.inputs.map((i) => i.specHash));
    if (typeof p === 'string') {
      io.err(`thermoscribe gen: ${p} (nothing was written)\n`);
      return EXIT.unusable;
    }
    plans.push(p);
  }
  // Both files or neither (cli/write-files.ts): the old pair stays on any failure.
  const failed = writeFilesTogether(plans.filter((p) => p.changed));
  if (failed) {
    io.err(`thermoscribe gen: ${failed} (nothing was changed)\n`);
    return EXIT.unusable;
  }
  for (const [i, ch] of gen.source.channels.entries()) {
    const input = gen.inputs[i]!;
    io.out(`${input.channelName}: ${ch.method}, ${ch.entries} ${ch.method === 'table' ? 'points' : 'segments'}, max error ${ch.maxErrorC.toFixed(4)} °C over codes ${input.codeLow}..${input.codeHigh} (target ${input.errorTarget} °C), about ${ch.bytesEstimate} bytes on an 8-bit AVR\n`);
  }
  for (const p of plans) io.out(`${p.changed ? (p.created ? 'created' : 'updated') : 'unchanged'} ${rel(io, p.file)}\n`);
  io.out('Caution: generated from a design model; verify the channel against a calibrated reference before relying on it (see the file header).\n');
  return EXIT.clean;
}

/** The new text of one file, or why it cannot be written. */
function plan(file: string, result: GenerateResult, header: boolean, names: string[], hashes: string[]): Planned | string {
  let existing: string | undefined;
  try {
    existing = fs.existsSync(file) ? fs.readFileSync(file, 'utf8') : undefined;
  } catch (err) {
    return `cannot read ${file}: ${err instanceof Error ? err.message : String(err)}`;
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
  let text = spliced.text;
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

function usage(io: CliIO, problem: string): number {
  io.err(`thermoscribe gen: ${problem}\nusage: ${GEN_USAGE}\n`);
  return EXIT.unusable;
}
