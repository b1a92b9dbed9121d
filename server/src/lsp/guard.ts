// Every request handler runs inside guard(): an exception is logged with the request, the
// document and the position, the client gets the fallback (empty) result, and the server keeps serving.
// A ResponseError is a deliberate refusal with a message for the user and passes through.
// After `shutdown` every request is refused with InvalidRequest (LSP 3.17, "Shutdown Request":
// "If a server receives requests after a shutdown request those requests should error with
// InvalidRequest") and nothing more is published.
import { ErrorCodes, ResponseError, type Connection } from 'vscode-languageserver/node';

const shutDown = new WeakSet<Connection>();

/** The client asked the server to shut down: requests are refused from now on. */
export function markShutDown(connection: Connection): void {
  shutDown.add(connection);
}

export function isShutDown(connection: Connection): boolean {
  return shutDown.has(connection);
}

/** Throws the LSP refusal when the server has been shut down. */
export function refuseAfterShutdown(connection: Connection, request: string): void {
  if (shutDown.has(connection)) throw new ResponseError(ErrorCodes.InvalidRequest, `${request}: the server has been shut down`);
}

interface Located {
  textDocument?: { uri: string };
  position?: { line: number; character: number };
}

export function guard<P, R>(connection: Connection, request: string, fallback: R, fn: (params: P) => R): (params: P) => R {
  return (params: P) => {
    refuseAfterShutdown(connection, request);
    try {
      return fn(params);
    } catch (err) {
      // A deliberate refusal (e.g. rename to an invalid name) goes to the client as its message.
      if (err instanceof ResponseError) throw err;
      const p = params as Located;
      const where = [p?.textDocument?.uri ?? 'no document', p?.position ? `${p.position.line + 1}:${p.position.character + 1}` : ''].filter(Boolean).join(' at ');
      connection.console.error(`thermoscribe: ${request} failed for ${where}: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
      return fallback;
    }
  };
}
