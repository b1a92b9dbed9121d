// In-editor suite: runs inside a real VS Code extension host (through @vscode/test-electron, or
// through code-server's smoke-test driver in tests/e2e/run-offline.ts). It checks that the
// extension wires the language server's features into the editor. The figures themselves are
// verified against their published sources in tests/unit; here only their presence is checked.
import * as path from 'node:path';
import { existsSync } from 'node:fs';
import * as vscode from 'vscode';
import { assert, runChecks, type Check } from './runner';
import { codeOf, waitForDiagnostics } from './wait';
import { firstContactChecks } from './first-contact';

// Generous: the first diagnostics need the extension host, the server process and a full
// analysis to start on a shared 2-core machine.
const FIRST_DIAGNOSTICS_MS = 120_000;
const DIAGNOSTICS_MS = 60_000;

function repoRoot(): string {
  for (const folder of vscode.workspace.workspaceFolders ?? []) {
    if (existsSync(path.join(folder.uri.fsPath, 'samples', 'greenhouse.tsense'))) return folder.uri.fsPath;
  }
  // The compiled suite lives in <repo>/.e2e/suite/index.js.
  return path.resolve(__dirname, '..', '..');
}

async function open(relative: string): Promise<vscode.TextDocument> {
  const uri = vscode.Uri.file(path.join(repoRoot(), relative));
  const doc = await vscode.workspace.openTextDocument(uri);
  await vscode.window.showTextDocument(doc, { preview: false });
  return doc;
}

/** Position inside the first occurrence of `needle` (plus `into` characters). */
function positionOf(doc: vscode.TextDocument, needle: string, into = 1): vscode.Position {
  const offset = doc.getText().indexOf(needle);
  assert(offset >= 0, `'${needle}' not found in ${doc.uri.fsPath}`);
  return doc.positionAt(offset + into);
}

function hoverText(hovers: vscode.Hover[]): string {
  const parts: string[] = [];
  for (const hover of hovers) {
    for (const c of hover.contents) {
      if (typeof c === 'string') parts.push(c);
      else parts.push(c.value);
    }
  }
  return parts.join('\n');
}

const isError = (d: vscode.Diagnostic): boolean => d.severity === vscode.DiagnosticSeverity.Error;

const PROBLEMS = 'samples/cold-chain-problems.tsense';
const CLEAN = 'samples/greenhouse.tsense';
let serverAnswered = false;

const checks: Check[] = [
  {
    name: 'a .tsense file opens with language id tsense and activates the extension',
    fn: async () => {
      const doc = await open(PROBLEMS);
      assert(doc.languageId === 'tsense', `language id is '${doc.languageId}', expected 'tsense'`);
      const ext = vscode.extensions.getExtension('thermoscribe.thermoscribe');
      assert(ext, 'extension thermoscribe.thermoscribe is not installed');
      await ext.activate();
      assert(ext.isActive, 'extension did not activate');
    },
  },
  {
    name: 'commands are registered (restart server, show server log)',
    fn: async () => {
      const all = await vscode.commands.getCommands(true);
      for (const id of ['thermoscribe.restartServer', 'thermoscribe.showServerLog']) {
        assert(all.includes(id), `command ${id} is not registered`);
      }
    },
  },
  {
    name: 'problems sample: diagnostics bias-current-low and clip-high appear',
    fn: async () => {
      const doc = await open(PROBLEMS);
      // The sample's own comments name the codes each channel must raise (invented scenario).
      await waitForDiagnostics(
        doc.uri,
        (ds) => ['bias-current-low', 'clip-high'].every((c) => ds.some((d) => codeOf(d) === c)),
        FIRST_DIAGNOSTICS_MS,
        'bias-current-low and clip-high',
      );
      serverAnswered = true;
    },
  },
  {
    name: 'clean sample (greenhouse): no diagnostic of error severity',
    fn: async () => {
      const doc = await open(CLEAN);
      // A clean file may publish an empty list, which raises no event. To know the server has
      // checked this very file, break it (0 bits is out of the 1..24 domain), wait for the error,
      // then put the text back and wait for the errors to go.
      const original = 'bits       = 12';
      const at = doc.getText().indexOf(original);
      assert(at >= 0, `greenhouse sample changed: '${original}' not found`);
      const valueStart = doc.positionAt(at + original.length - 2);
      const broken = new vscode.WorkspaceEdit();
      broken.replace(doc.uri, new vscode.Range(valueStart, valueStart.translate(0, 2)), '0');
      assert(await vscode.workspace.applyEdit(broken), 'could not edit the greenhouse sample in memory');
      try {
        await waitForDiagnostics(doc.uri, (ds) => ds.some(isError), FIRST_DIAGNOSTICS_MS, 'an error for bits = 0');
      } finally {
        const restore = new vscode.WorkspaceEdit();
        restore.replace(doc.uri, new vscode.Range(valueStart, valueStart.translate(0, 1)), '12');
        await vscode.workspace.applyEdit(restore);
        // Same text as on disk (the runners work on a copy of samples/); saving clears the dirty mark.
        await doc.save();
      }
      assert(doc.getText().includes(original), 'the sample text was not restored');
      await waitForDiagnostics(doc.uri, (ds) => !ds.some(isError), DIAGNOSTICS_MS, 'no errors after the revert')
        .catch((err: unknown) => {
          const errors = vscode.languages.getDiagnostics(doc.uri).filter(isError);
          throw new Error(`errors in the clean sample: ${errors.map((d) => `${codeOf(d)} at line ${d.range.start.line + 1}: ${d.message}`).join('; ') || String(err)}`);
        });
    },
  },
  {
    name: 'hover on a channel name shows a figure (counts or mV/K)',
    fn: async () => {
      const doc = await open(CLEAN);
      const hovers = await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', doc.uri, positionOf(doc, 'channel bench_air', 'channel '.length + 2));
      const text = hoverText(hovers ?? []);
      assert(text.length > 0, 'no hover on channel bench_air');
      assert(/counts|mV\/K/.test(text), `hover does not mention counts or mV/K: ${text.slice(0, 200)}`);
    },
  },
  {
    name: 'inlay hints: at least one in the clean sample',
    fn: async () => {
      const doc = await open(CLEAN);
      const whole = new vscode.Range(new vscode.Position(0, 0), doc.lineAt(doc.lineCount - 1).range.end);
      const hints = await vscode.commands.executeCommand<vscode.InlayHint[]>('vscode.executeInlayHintProvider', doc.uri, whole);
      assert((hints ?? []).length >= 1, 'no inlay hints');
    },
  },
  {
    name: 'code action: a quick fix at the bias-current-low diagnostic',
    fn: async () => {
      const doc = await open(PROBLEMS);
      const ds = await waitForDiagnostics(doc.uri, (d) => d.some((x) => codeOf(x) === 'bias-current-low'), DIAGNOSTICS_MS, 'bias-current-low');
      const diag = ds.find((d) => codeOf(d) === 'bias-current-low');
      assert(diag, 'no bias-current-low diagnostic');
      const actions = await vscode.commands.executeCommand<(vscode.CodeAction | vscode.Command)[]>(
        'vscode.executeCodeActionProvider', doc.uri, diag.range, vscode.CodeActionKind.QuickFix.value);
      const fixes = (actions ?? []).filter((a): a is vscode.CodeAction => 'kind' in a && a.kind !== undefined && vscode.CodeActionKind.QuickFix.contains(a.kind));
      assert(fixes.length >= 1, `no quick fix (got ${(actions ?? []).length} actions)`);
    },
  },
  {
    name: 'compare command: the comparison panel opens beside the sous-vide sample',
    fn: async () => {
      const doc = await open('samples/sous-vide.tsense');
      await vscode.commands.executeCommand('thermoscribe.showComparison', doc.uri.toString(), 'bath');
      const title = 'Compare: bath';
      const deadline = Date.now() + 20_000;
      const tabs = () => vscode.window.tabGroups.all.flatMap((g) => g.tabs).map((t) => t.label);
      while (!tabs().includes(title) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 100));
      assert(tabs().includes(title), `no tab '${title}' (tabs: ${tabs().join(', ')})`);
    },
  },
  {
    name: 'restart command: the server comes back and republishes diagnostics',
    fn: async () => {
      assert(serverAnswered, 'skipped: the server published nothing for the problems sample');
      const doc = await open(PROBLEMS);
      await vscode.commands.executeCommand('thermoscribe.restartServer');
      await waitForDiagnostics(doc.uri, (ds) => ds.some((d) => codeOf(d) === 'bias-current-low'), FIRST_DIAGNOSTICS_MS, 'bias-current-low after restart');
    },
  },
];

/** Entry point called by the extension host's test loader. Rejects when any check fails. */
export async function run(): Promise<void> {
  const results = await runChecks([...checks, ...firstContactChecks(open)]);
  const failed = results.filter((r) => !r.ok);
  if (failed.length > 0) throw new Error(`${failed.length} of ${results.length} editor checks failed: ${failed.map((f) => f.name).join('; ')}`);
}
