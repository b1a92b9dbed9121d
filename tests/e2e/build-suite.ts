// Compiles the in-editor suite (tests/e2e/suite) into one CommonJS file the extension host can load.
import * as path from 'node:path';
import { build } from 'esbuild';

export const ROOT = path.resolve(__dirname, '..', '..');
export const SUITE_OUT = path.join(ROOT, '.e2e', 'suite', 'index.js');

export async function buildSuite(): Promise<string> {
  await build({
    entryPoints: [path.join(ROOT, 'tests', 'e2e', 'suite', 'index.ts')],
    outfile: SUITE_OUT,
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    external: ['vscode'],
    logLevel: 'warning',
  });
  return SUITE_OUT;
}
