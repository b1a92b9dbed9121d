// Bundles the CLI/language server (dist/cli.js) and the VS Code client (dist/client.js) with esbuild.
import { build } from 'esbuild';
import { existsSync } from 'node:fs';

const common = { bundle: true, platform: 'node', target: 'node20', format: 'cjs', sourcemap: false, logLevel: 'warning', legalComments: 'none' };
await build({ ...common, entryPoints: ['server/src/cli/entry.ts'], outfile: 'dist/cli.js' });
if (existsSync('client/src/extension.ts')) {
  await build({ ...common, entryPoints: ['client/src/extension.ts'], outfile: 'dist/client.js', external: ['vscode'] });
}
console.log('bundle: wrote dist/');
