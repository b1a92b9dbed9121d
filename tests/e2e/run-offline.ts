// End-to-end tests in a real VS Code build, offline: the packaged .vsix installed into an isolated
// code-server, driven by Debian's chromium. Install the pieces with scripts/e2e/install.sh.
//
//   npm run test:e2e
//
// (1) runs the in-editor suite (tests/e2e/suite) inside code-server's extension host through the
//     smoke-test driver; (2) walks through the page as a user and saves screenshots to
//     .test-output/e2e/. Skips (exit 0) when the editor is not installed, unless CI=true.
import * as path from 'node:path';
import { copyFileSync, cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { execFileSync } from 'node:child_process';
import { buildSuite } from './build-suite';
import { missingPieces, OUTPUT_DIR, ROOT } from './offline/paths';
import { freePort, installExtension, makeSandbox, serve, stopGroup, waitUntilServing, type Served } from './offline/code-server';
import { launch, runSuiteThroughPayload, walkAsUser, type Outcome } from './offline/browser';
import { plotPanelStep } from './plot-screenshot';
import { issue14Steps } from './editor-issue14';
import { devPathStep } from './dev-path';
import { TOUR_FILE, TOUR_FLAG, tourStep } from './tour-screenshot';
import { checkGrammar } from './offline/grammar';

const SUITE_TIMEOUT_MS = 8 * 60_000;

interface CheckResult { name: string; ok: boolean; error?: string }

function seconds(t0: number): string {
  return `${((Date.now() - t0) / 1000).toFixed(1)} s`;
}

async function main(): Promise<number> {
  const missing = missingPieces();
  if (missing.length > 0) {
    const what = `not installed: ${missing.join(', ')}. Run scripts/e2e/install.sh, then npm ci.`;
    if (process.env.CI === 'true') {
      console.error(`E2E: ${what}`);
      console.log('E2E: 0 passed, 1 failed');
      return 1;
    }
    console.log(`E2E: skipped, the offline editor is ${what}`);
    return 0;
  }

  const t0 = Date.now();
  mkdirSync(OUTPUT_DIR, { recursive: true });
  console.log('E2E: packaging the extension (npm run package)');
  try {
    execFileSync('npm', ['run', '--silent', 'package'], { cwd: ROOT, stdio: ['ignore', 'inherit', 'inherit'] });
  } catch {
    console.error('E2E: packaging failed (npm run package); the build output above says why.');
    console.log('E2E: 0 passed, 1 failed');
    return 1;
  }
  const vsix = path.join(ROOT, 'thermoscribe.vsix');
  const suiteIndex = await buildSuite();

  const tmp = mkdtempSync(path.join(tmpdir(), 'thermoscribe-e2e-'));
  const resultsFile = path.join(tmp, 'suite-results.json');
  const sandbox = makeSandbox(tmp, { THERMOSCRIBE_E2E_RESULTS: resultsFile });
  // A small workspace holding a copy of the samples keeps file search and watching cheap.
  const workspace = path.join(tmp, 'workspace');
  cpSync(path.join(ROOT, 'samples'), path.join(workspace, 'samples'), { recursive: true });

  installExtension(sandbox, vsix);
  const installed = readdirSync(sandbox.extensions).find((d) => d.startsWith('thermoscribe.thermoscribe-'));
  if (!installed) throw new Error(`the .vsix did not install into ${sandbox.extensions}`);
  const extensionDir = path.join(sandbox.extensions, installed);
  console.log(`E2E: installed ${installed} (${seconds(t0)} since start)`);

  const results: Outcome[] = [await checkGrammar()];
  let served: Served | undefined;
  const onSignal = (): void => { if (served) void stopGroup(served.child).then(() => process.exit(130)); };
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  try {
    served = serve(sandbox, await freePort(), workspace, path.join(OUTPUT_DIR, 'code-server.log'));
    await waitUntilServing(served, 60_000);
    console.log(`E2E: code-server answers on ${served.url}`);
    const context = await launch(path.join(tmp, 'chromium-profile'));
    try {
      // (1) The in-editor suite, through the API.
      const t1 = Date.now();
      const code = await runSuiteThroughPayload(context, served.url, workspace, extensionDir, suiteIndex, SUITE_TIMEOUT_MS,
        (line) => console.log(`  ${line}`));
      const suite: CheckResult[] = existsSync(resultsFile) ? JSON.parse(readFileSync(resultsFile, 'utf8')) as CheckResult[] : [];
      for (const r of suite) results.push({ name: `editor: ${r.name}`, ok: r.ok, detail: r.error });
      if (code === null) results.push({ name: 'editor: suite finished', ok: false, detail: `no exit code within ${SUITE_TIMEOUT_MS / 1000} s` });
      else if (suite.length === 0) results.push({ name: 'editor: suite reported its checks', ok: false, detail: `exit code ${code} but no results file` });
      else if ((code === 0) !== suite.every((r) => r.ok)) results.push({ name: 'editor: exit code agrees with the checks', ok: false, detail: `exit code ${code}` });
      console.log(`E2E: in-editor suite done in ${seconds(t1)} (exit code ${code ?? 'none'})`);

      // (2) The same extension, as a user sees it.
      const t2 = Date.now();
      for (const o of await walkAsUser(context, served.url, workspace, OUTPUT_DIR)) results.push({ ...o, name: `page: ${o.name}` });
      console.log(`E2E: page walk done in ${seconds(t2)}`);
      // The README's screenshot, saved in the output folder; copied over the committed
      // media/editor-tour.png only when asked (THERMOSCRIBE_TOUR=1), so that ordinary runs leave it alone.
      const tour = await tourStep(context, served.url, workspace, OUTPUT_DIR);
      results.push(...tour);
      if (process.env[TOUR_FLAG] === '1' && tour.every((o) => o.ok)) {
        mkdirSync(path.join(ROOT, 'media'), { recursive: true });
        copyFileSync(path.join(OUTPUT_DIR, TOUR_FILE), path.join(ROOT, 'media', TOUR_FILE));
        console.log(`E2E: media/${TOUR_FILE} replaced by this run's screenshot (${TOUR_FLAG}=1); look at it before committing`);
      }

      // (3) The plot panel, opened from the command palette, with a screenshot.
      const t3 = Date.now();
      for (const o of await plotPanelStep(context, served.url, workspace, OUTPUT_DIR)) results.push(o.name.startsWith('page:') ? o : { ...o, name: `page: ${o.name}` });
      console.log(`E2E: plot panel done in ${seconds(t3)}`);

      // (4) Issue 14 as an author meets it: fixes, hints, hover, plot errors, completion, indentation.
      const t4 = Date.now();
      for (const o of await issue14Steps(context, served.url, workspace, OUTPUT_DIR)) results.push(o);
      console.log(`E2E: issue 14 walk done in ${seconds(t4)}`);
      // (5) The extension loaded from the repository (extensionDevelopmentPath only, no suite).
      const t5 = Date.now();
      results.push(...await devPathStep(context, served.url, workspace, OUTPUT_DIR));
      console.log(`E2E: development path done in ${seconds(t5)}`);
    } finally {
      await context.close().catch(() => undefined);
    }
  } catch (err) {
    results.push({ name: 'offline editor run', ok: false, detail: err instanceof Error ? err.message : String(err) });
  } finally {
    if (served) await stopGroup(served.child);
    process.removeListener('SIGINT', onSignal);
    process.removeListener('SIGTERM', onSignal);
    rmSync(tmp, { recursive: true, force: true, maxRetries: 3 });
  }

  for (const r of results) console.log(`${r.ok ? 'PASS' : 'FAIL'} ${r.name}${r.detail ? ` — ${r.detail}` : ''}`);
  const passed = results.filter((r) => r.ok).length;
  const failed = results.length - passed;
  console.log(`E2E: screenshots and the code-server log are in ${path.relative(ROOT, OUTPUT_DIR)}/ (${seconds(t0)} in all)`);
  console.log(`E2E: ${passed} passed, ${failed} failed`);
  return failed === 0 ? 0 : 1;
}

main().then((code) => { process.exitCode = code; }, (err: unknown) => {
  console.error(`E2E: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
  console.log('E2E: 0 passed, 1 failed');
  process.exitCode = 1;
});
