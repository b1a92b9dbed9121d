// `thermoscribe serve --stdio`: the language server over stdin/stdout. It keeps serving
// (the connection holds the process open until the client sends exit).
import { createConnection, ProposedFeatures } from 'vscode-languageserver/node';
import { createServer } from './server';

export function startServer(): void {
  const connection = createConnection(ProposedFeatures.all, process.stdin, process.stdout);
  // Anything written to stdout would corrupt the protocol stream: route console output to stderr.
  console.log = (...args: unknown[]) => process.stderr.write(args.map(String).join(' ') + '\n');
  // Never die on a stray promise (a client refusing a request we sent, say): log it and keep serving.
  process.on('unhandledRejection', (err) => connection.console.error(`thermoscribe: unhandled rejection: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`));
  createServer(connection);
  connection.listen();
}
