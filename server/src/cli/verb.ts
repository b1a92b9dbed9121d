// The one rule of every verb: its options declared as data (read and checked here, its usage line
// made from the same table) and its exit status from what it reports (README, "Exit status"):
//   0  done, and no error-severity diagnostic;
//   1  error diagnostics (printed), or the work could not be done for the spec (no channel to work
//      on, a design that cannot be made, a drawing or a file write that failed);
//   2  unusable input: bad or unknown options, a missing or unreadable spec, an unknown channel or group.
// A write failure is exit 1: the input was usable, the work (writing) could not be done.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { parseArgs } from 'node:util';
import type { Diagnostic } from '../engine';
import { shown as shownText } from '../engine';
import type { LineIndex } from '../engine';
import { EXIT, type CliIO } from './io';
import { formatDiagnostic } from './text';

export type OptionSpec =
  /** One of a fixed list; the first is the default. */
  | { kind: 'choice'; values: readonly string[] }
  /** A whole number written in digits, within [min, max]. */
  | { kind: 'whole'; meta: string; min: number; max: number }
  /** A non-empty name (a channel, a group). */
  | { kind: 'name'; meta: string; required?: boolean }
  /** A folder that exists. */
  | { kind: 'folder'; meta: string }
  /** A file to write: its folder must exist; `suffix`, when given, is required. */
  | { kind: 'output'; meta: string; suffix?: string; required?: boolean }
  /** A file to read: it must exist. */
  | { kind: 'input'; meta: string; required?: boolean }
  /** A switch that takes no value. */
  | { kind: 'flag' };

export interface VerbSpec {
  name: string;
  /** `one`: exactly one spec file; `many`: one or more. */
  files: 'one' | 'many';
  options: Readonly<Record<string, OptionSpec>>;
}

/** Options several verbs share (the same meaning and range everywhere). */
export const ROOT_OPTION: OptionSpec = { kind: 'folder', meta: 'DIR' };
export const CHANNEL_OPTION: OptionSpec = { kind: 'name', meta: 'NAME' };
export const RUNS_OPTION: OptionSpec = { kind: 'whole', meta: 'N', min: 0, max: 1_000_000 };
export const SEED_OPTION: OptionSpec = { kind: 'whole', meta: 'S', min: 0, max: 4294967295 };

export interface VerbArgs {
  files: string[];
  /** Checked option values: a string (choice, name, folder, output) or a number (whole); undefined when absent. */
  text(name: string): string | undefined;
  whole(name: string): number | undefined;
  /** Whether a `flag` option was given. */
  flag(name: string): boolean;
}

/** What a verb reports; `settle` turns it into the exit status (the one place of the rule). */
export interface Outcome {
  /** Unusable input: printed with the verb's usage line; exit 2. */
  unusable?: string;
  /** The work could not be done for the spec: printed; exit 1. */
  failed?: string;
  /** The spec's diagnostics: exit 1 when any is an error. */
  diagnostics?: readonly Diagnostic[];
  /** Set when the verb has not printed the diagnostics itself: their error-severity ones go to stderr. */
  unprinted?: { index(file: string): LineIndex };
  /** Stopped by Ctrl+C: exit 130. */
  cancelled?: boolean;
}

export const EXIT_CANCELLED = 130;

export function usageLine(spec: VerbSpec): string {
  const parts = [`thermoscribe ${spec.name}`, spec.files === 'one' ? 'FILE' : 'FILE...'];
  for (const [name, o] of Object.entries(spec.options)) {
    if (o.kind === 'flag') {
      parts.push(`[--${name}]`);
      continue;
    }
    const meta = o.kind === 'choice' ? o.values.join('|') : o.meta;
    const required = (o.kind === 'name' || o.kind === 'output' || o.kind === 'input') && o.required;
    parts.push(required ? `--${name} ${meta}` : `[--${name} ${meta}]`);
  }
  return parts.join(' ');
}

/** Reads and checks the arguments against the verb's table: the values, or what is wrong with them. */
export function readVerbArgs(spec: VerbSpec, argv: string[], cwd: string): VerbArgs | string {
  // Every declared option takes a value; unknown ones still come as tokens (strict: false) and are refused below.
  const declared = Object.fromEntries(Object.entries(spec.options).map(([n, o]) => [n, { type: o.kind === 'flag' ? ('boolean' as const) : ('string' as const) }]));
  const { tokens } = parseArgs({ args: argv, options: declared, strict: false, allowPositionals: true, tokens: true });
  const files: string[] = [];
  const values = new Map<string, string | number>();
  const known = Object.keys(spec.options).map((n) => `--${n}`).join(', ');
  for (const t of tokens) {
    if (t.kind === 'positional') files.push(t.value);
    if (t.kind !== 'option') continue;
    const o = Object.prototype.hasOwnProperty.call(spec.options, t.name) ? spec.options[t.name] : undefined;
    if (!o) return `unknown option ${shown(t.rawName)}; ${spec.name} takes ${known || 'no options'}`;
    if (o.kind === 'flag') {
      if (t.value !== undefined) return `option --${t.name} takes no value (got ${shown(t.value)})`;
      values.set(t.name, 'yes');
      continue;
    }
    if (t.value === undefined) return `option --${t.name} needs a value: ${describe(o)}`;
    const v = checkValue(t.name, o, t.value, cwd);
    if (typeof v === 'string' && v.startsWith('\0')) return v.slice(1);
    values.set(t.name, v);
  }
  for (const [name, o] of Object.entries(spec.options)) {
    if ((o.kind === 'name' || o.kind === 'output' || o.kind === 'input') && o.required && !values.has(name)) return `--${name} ${o.meta} is required`;
  }
  if (spec.files === 'one' && files.length !== 1) return 'name exactly one .tsense file';
  if (files.length === 0) return 'name at least one .tsense file';
  return {
    files,
    text: (name) => {
      const v = values.get(name) ?? defaultOf(spec.options[name]);
      return typeof v === 'string' ? v : undefined;
    },
    whole: (name) => {
      const v = values.get(name);
      return typeof v === 'number' ? v : undefined;
    },
    flag: (name) => values.has(name),
  };
}

function defaultOf(o: OptionSpec | undefined): string | undefined {
  return o?.kind === 'choice' ? o.values[0] : undefined;
}

function describe(o: OptionSpec): string {
  switch (o.kind) {
    case 'choice':
      return o.values.length === 2 ? `${o.values[0]} or ${o.values[1]}` : `${o.values.slice(0, -1).join(', ')} or ${o.values[o.values.length - 1]}`;
    case 'whole':
      return `a whole number from ${o.min} to ${o.max}, in digits`;
    case 'name':
      return 'a name';
    case 'folder':
      return 'an existing folder';
    case 'output':
      return `a file in an existing folder${o.suffix ? `, ending in ${o.suffix}` : ''}`;
    case 'input':
      return 'an existing file';
    case 'flag':
      return 'no value';
  }
}

/** The checked value, or a message marked with a leading NUL. */
function checkValue(name: string, o: OptionSpec, raw: string, cwd: string): string | number {
  const bad = (why = '') => `\0--${name} takes ${describe(o)}${why} (got ${shown(raw)})`;
  switch (o.kind) {
    case 'choice':
      return o.values.includes(raw) ? raw : bad();
    case 'whole': {
      if (!/^[0-9]{1,16}$/.test(raw)) return bad();
      const n = Number(raw);
      return n >= o.min && n <= o.max ? n : bad();
    }
    case 'name':
      return raw.trim() !== '' ? raw : bad();
    case 'folder': {
      if (raw === '') return bad();
      try {
        return fs.statSync(path.resolve(cwd, raw)).isDirectory() ? raw : bad(': that is not a folder');
      } catch {
        return bad(': no such folder');
      }
    }
    case 'flag':
      return bad();
    case 'input': {
      if (raw === '') return bad();
      try {
        return fs.statSync(path.resolve(cwd, raw)).isFile() ? raw : bad(': that is not a file');
      } catch {
        return bad(': no such file');
      }
    }
    case 'output': {
      if (raw === '' || /[\\/]$/.test(raw)) return bad();
      if (o.suffix && !raw.endsWith(o.suffix)) return bad();
      const dir = path.dirname(path.resolve(cwd, raw));
      try {
        if (!fs.statSync(dir).isDirectory()) return bad(`: ${dir} is not a folder`);
      } catch {
        return bad(`: the folder ${dir} does not exist`);
      }
      return raw;
    }
  }
}

/** Echoed user text, quoted: control characters escaped and long text shortened by checks/shown.ts. */
export function shown(text: string): string {
  return `'${shownText(text)}'`;
}

/** Prints what the outcome needs printed and gives the exit status. */
export function settle(spec: VerbSpec, o: Outcome, io: CliIO): number {
  if (o.unusable !== undefined) {
    io.err(`thermoscribe ${spec.name}: ${o.unusable}\nusage: ${usageLine(spec)}\n`);
    return EXIT.unusable;
  }
  const errors = (o.diagnostics ?? []).filter((d) => d.severity === 'error');
  if (o.unprinted) for (const d of errors) io.err(formatDiagnostic(d, o.unprinted.index(d.file), io.cwd) + '\n');
  if (o.cancelled) {
    io.err(`\nthermoscribe ${spec.name}: cancelled\n`);
    return EXIT_CANCELLED;
  }
  if (o.failed !== undefined) io.err(`thermoscribe ${spec.name}: ${o.failed}\n`);
  return o.failed !== undefined || errors.length > 0 ? EXIT.errors : EXIT.clean;
}

/** A verb from its table and its body: the arguments are checked first, the outcome settled last. */
export function defineVerb(spec: VerbSpec, body: (args: VerbArgs, io: CliIO) => Outcome): (argv: string[], io: CliIO) => number;
export function defineVerb(spec: VerbSpec, body: (args: VerbArgs, io: CliIO) => Promise<Outcome>): (argv: string[], io: CliIO) => Promise<number>;
export function defineVerb(spec: VerbSpec, body: (args: VerbArgs, io: CliIO) => Outcome | Promise<Outcome>): (argv: string[], io: CliIO) => number | Promise<number> {
  return (argv, io) => {
    const args = readVerbArgs(spec, argv, io.cwd);
    if (typeof args === 'string') return settle(spec, { unusable: args }, io);
    const o = body(args, io);
    return o instanceof Promise ? o.then((x) => settle(spec, x, io)) : settle(spec, o, io);
  };
}
