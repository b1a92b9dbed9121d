// Placeholder until the language server lands: `thermoscribe serve` reports it is unavailable.
export function startServer(): number {
  process.stderr.write('thermoscribe serve: the language server is not built into this version\n');
  return 2;
}
