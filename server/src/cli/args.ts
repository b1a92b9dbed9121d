// A small argument reader: positional files plus --name value / --name=value options.

export interface ParsedArgs {
  positional: string[];
  options: Map<string, string | true>;
}

export function parseArgs(argv: string[], withValue: string[]): ParsedArgs | string {
  const positional: string[] = [];
  const options = new Map<string, string | true>();
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === '--') {
      positional.push(...argv.slice(i + 1));
      break;
    }
    if (a.startsWith('--')) {
      const eq = a.indexOf('=');
      const name = eq > 0 ? a.slice(2, eq) : a.slice(2);
      if (withValue.includes(name)) {
        const value = eq > 0 ? a.slice(eq + 1) : argv[++i];
        if (value === undefined) return `option --${name} needs a value`;
        options.set(name, value);
      } else if (eq > 0) return `option --${name} takes no value`;
      else options.set(name, true);
    } else positional.push(a);
  }
  return { positional, options };
}

/** A whole-number option within [lo, hi]: the number, undefined when absent, or a message. */
export function wholeNumberOption(args: ParsedArgs, name: string, lo: number, hi: number): number | undefined | string {
  const v = args.options.get(name);
  if (v === undefined) return undefined;
  const n = Number(v);
  return Number.isInteger(n) && n >= lo && n <= hi ? n : `--${name} takes a whole number from ${lo} to ${hi} (got '${String(v)}')`;
}
