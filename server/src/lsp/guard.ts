// Every request handler runs inside guard(): an exception is logged with the request, the
// document and the position, the client gets the fallback (empty) result, and the server keeps serving.
// A ResponseError is a deliberate refusal with a message for the user and passes through.
import { ResponseError, type Connection } from 'vscode-languageserver/node';

interface Located {
  textDocument?: { uri: string };
  position?: { line: number; character: number };
}

export function guard<P, R>(connection: Connection, request: string, fallback: R, fn: (params: P) => R): (params: P) => R {
  return (params: P) => {
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
