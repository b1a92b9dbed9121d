// thermoscribe gen FILE [--channel NAME] [--out PATH] [--root DIR]
// Writes the conversion code of every channel (or one) to PATH (default `<spec-stem>_conversion.c`
// beside the spec) and the header beside it (same stem, `.h`). An existing file has only the
// marked blocks replaced (blocks of channels not in it are added); hand-written code is kept.
// Exit status by the one rule of cli/verb.ts: 1 also when a channel's code cannot be made as asked
// or a write fails; 2 also for damaged markers in an existing file (an input gen cannot use).
// Both files are planned (and any damaged marker refused) before either is written.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { scanGeneratedBlocks, spliceGenerated } from '../../codegen/markers';
import { conversionFilePath, headerPathFor } from '../../codegen/channel-input';
import { generateForSpec } from '../../codegen/spec';
import type { GenerateResult, SpliceBlock } from '../../codegen/types';
import { DiskHost, type CliIO } from '../io';
import { CHANNEL_OPTION, defineVerb, ROOT_OPTION, shown, usageLine, type Outcome, type VerbSpec } from '../verb';
import { analyseOne } from './check';

export const GEN: VerbSpec = {
  name: 'gen',
  files: 'one',
  options: { channel: CHANNEL_OPTION, out: { kind: 'output', meta: 'PATH.c', suffix: '.c' }, root: ROOT_OPTION },
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
  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'string') return { unusable: a };
  const spec = { diagnostics: a.diagnostics, unprinted: { index: (f: string) => host.index(f) } };
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length > 0) return { ...spec, failed: `the spec has ${errors.length} error${errors.length === 1 ? '' : 's'}; fix them first (nothing was written)` };
  if (channel !== undefined && !a.channels.some((r) => r.channel.name === channel)) {
    return { unusable: `no channel ${shown(channel)} in ${path.basename(a.path)}; channels: ${a.channels.map((r) => r.channel.name).join(', ') || '(none)'}` };
  }
  const cPath = out !== undefined ? path.resolve(io.cwd, out) : conversionFilePath(a.path);
  const hPath = headerPathFor(cPath);
  const stem = path.basename(cPath, '.c');
  const gen = generateForSpec(a, { channel, fileStem: stem });
  if (!gen.ok) return { ...spec, failed: `${gen.message} (nothing was written)` };
  const plans: Planned[] = [];
  for (const [file, result, header] of [[cPath, gen.source, false], [hPath, gen.header, true]] as const) {
    const p = plan(file, result, header, gen.inputs.map((i) => i.channelName), gen.inputs.map((i) => i.specHash));
    // Damaged markers in an existing file: an input gen cannot use (2); a file it cannot read: 1.
    if (typeof p === 'string') return { unusable: `${p} (nothing was written)` };
    if ('unreadable' in p) return { ...spec, failed: `${p.unreadable} (nothing was written)` };
    plans.push(p);
  }
  for (const p of plans) {
    if (!p.changed) continue;
    const failed = writeAtomically(p.file, p.text);
    if (failed) return { ...spec, failed: `cannot write ${rel(io, p.file)}: ${failed}` };
  }
  for (const [i, ch] of gen.source.channels.entries()) {
    const input = gen.inputs[i]!;
    io.out(`${input.channelName}: ${ch.method}, ${ch.entries} ${ch.method === 'table' ? 'points' : 'segments'}, max error ${ch.maxErrorC.toFixed(4)} °C over codes ${input.codeLow}..${input.codeHigh} (target ${input.errorTarget} °C), about ${ch.bytesEstimate} bytes on an 8-bit AVR\n`);
  }
  for (const p of plans) io.out(`${p.changed ? (p.created ? 'created' : 'updated') : 'unchanged'} ${rel(io, p.file)}\n`);
  io.out('Caution: generated from a design model; verify the channel against a calibrated reference before relying on it (see the file header).\n');
  return spec;
});

/** The new text of one file, or why it cannot be written. */
function plan(file: string, result: GenerateResult, header: boolean, names: string[], hashes: string[]): Planned | { unreadable: string } | string {
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
  const tail = header && blocks.some((b) => !present.has(b.channel)) ? existing.search(/#ifdef __cplusplus\r?\n\}\r?\n#endif\r?\n#endif[^\n]*\n?$/) : -1;
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

/** Temp file in the same folder, then rename over the target (atomic on POSIX); undefined when done. */
function writeAtomically(file: string, text: string): string | undefined {
  const tmp = path.join(path.dirname(file), `.${path.basename(file)}.${process.pid}.${Date.now().toString(36)}.tmp`);
  try {
    let mode: number | undefined;
    try {
      mode = fs.statSync(file).mode & 0o777;
    } catch {
      mode = undefined;
    }
    fs.writeFileSync(tmp, text, { encoding: 'utf8', flag: 'wx', ...(mode !== undefined ? { mode } : {}) });
    fs.renameSync(tmp, file);
    return undefined;
  } catch (err) {
    try {
      fs.rmSync(tmp, { force: true });
    } catch {
      // nothing more to clean up
    }
    return err instanceof Error ? err.message : String(err);
  }
}

function rel(io: CliIO, file: string): string {
  return path.relative(io.cwd, file) || file;
}
