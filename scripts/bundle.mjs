// Bundles the CLI/language server (dist/cli.js) and the VS Code client (dist/client.js) with esbuild.
import { build } from 'esbuild';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';

const common = { bundle: true, platform: 'node', target: 'node20', format: 'cjs', sourcemap: false, logLevel: 'warning', legalComments: 'none' };
// vega-canvas's Node build loads the optional native `canvas` with a top-level await, which a CommonJS
// bundle cannot hold; its browser build returns no canvas in Node and vega then estimates text widths.
const noNodeCanvas = { 'vega-canvas': './node_modules/vega-canvas/build/vega-canvas.browser.js' };
await build({ ...common, entryPoints: ['server/src/cli/entry.ts'], outfile: 'dist/cli.js', alias: noNodeCanvas });
if (existsSync('client/src/extension.ts')) {
  await build({ ...common, entryPoints: ['client/src/extension.ts'], outfile: 'dist/client.js', external: ['vscode'], minify: true });
}
if (existsSync('client/webview/plot-view.ts')) {
  // The plot panel's script, run inside the webview (a browser): one file, no remote content.
  await build({ ...common, platform: 'browser', target: 'es2020', format: 'iife', minify: true, entryPoints: ['client/webview/plot-view.ts'], outfile: 'dist/webview/plot-view.js' });
}
if (process.argv.includes('--bench')) {
  // npm run bench times the engine as it ships (one bundle), not through a TypeScript loader. Each
  // bench file also runs alone when it is the main module; in one bundle every file would think so.
  await build({ ...common, entryPoints: ['bench/run.ts'], outfile: 'dist/bench.js', alias: noNodeCanvas, define: { 'require.main': 'undefined' } });
}
// The packaged README (package.json "vsce".readmePath): README.md without its images. The editor
// shows only https images in an extension's README, and the project names no public repository,
// so the repository's screenshot (media/editor-tour.png) stays out of the package.
const readme = readFileSync('README.md', 'utf8').split('\n').filter((l) => !/^!\[[^\]]*\]\((?![a-z]+:)[^)]*\)\s*$/i.test(l));
mkdirSync('dist', { recursive: true });
writeFileSync('dist/README.md', readme.join('\n').replace(/\n{3,}/g, '\n\n'));
console.log('bundle: wrote dist/');
