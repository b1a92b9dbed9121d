// In-editor checks of issue #14 items 4 and 5 (first contact): generating conversion code shows
// the written file at the channel's block, and a half-typed range asks for its upper end. Run by
// suite/index.ts after its own checks.
import * as vscode from 'vscode';
import { assert, type Check } from './runner';
import { waitForDiagnostics } from './wait';

const DIAGNOSTICS_MS = 120_000;

export function firstContactChecks(open: (relative: string) => Promise<vscode.TextDocument>): Check[] {
  return [
    {
      name: 'generate conversion code for soil: the C file opens at its block, with what was written',
      fn: async () => {
        const doc = await open('samples/greenhouse.tsense');
        const at = doc.positionAt(doc.getText().indexOf('channel soil') + 'channel '.length + 1);
        // The 4th argument resolves the first actions (their edit and command come from codeAction/resolve).
        const actions = await vscode.commands.executeCommand<vscode.CodeAction[]>('vscode.executeCodeActionProvider', doc.uri, new vscode.Range(at, at), 'refactor', 10);
        const gen = (actions ?? []).find((a) => a.title === 'Generate conversion code for soil');
        assert(gen?.edit, `no resolved "Generate conversion code for soil" (got ${(actions ?? []).map((a) => a.title).join('; ')})`);
        assert(gen.command?.command === 'thermoscribe.showGenerated', `the action carries no show command (${gen.command?.command ?? 'none'})`);
        assert(await vscode.workspace.applyEdit(gen.edit), 'the edit was not applied');
        await vscode.commands.executeCommand(gen.command.command, ...(gen.command.arguments ?? []));
        const editor = vscode.window.activeTextEditor;
        assert(editor && editor.document.uri.fsPath.endsWith('greenhouse_conversion.c'), `the active editor is ${editor?.document.uri.fsPath ?? 'none'}`);
        const line = editor.document.lineAt(editor.selection.active.line).text;
        assert(/thermoscribe:begin channel=soil /.test(line), `the cursor is not at soil's block: '${line}'`);
        const args = gen.command.arguments?.[0] as { message?: string } | undefined;
        assert(/worst error [\d.]+ °C .* bytes of flash .* bytes of C/.test(args?.message ?? ''), `the summary lacks method, error or bytes: ${args?.message}`);
        await editor.document.save();
      },
    },
    {
      name: 'a half-typed range (range = 0 °C .. ) asks for the upper end',
      fn: async () => {
        const doc = await vscode.workspace.openTextDocument({ language: 'tsense', content: 'channel c {\n  range = 0 °C .. \n}\n' });
        await vscode.window.showTextDocument(doc, { preview: false });
        try {
          const ds = await waitForDiagnostics(doc.uri, (d) => d.some((x) => /upper end/.test(x.message)), DIAGNOSTICS_MS, 'a message asking for the upper end');
          assert(!ds.some((d) => /found "\."/.test(d.message)), 'the old message about "." is still there');
        } finally {
          // Leave no unsaved editor behind: the page steps after the suite restore the window, and
          // closing an unsaved editor there asks whether to save it.
          await vscode.commands.executeCommand('workbench.action.revertAndCloseActiveEditor');
        }
      },
    },
  ];
}
