// Type shim: the root tsconfig uses `moduleResolution: node`, which ignores package `exports`, so
// TypeScript cannot see `vscode-languageserver/node` nor the packages it re-exports (they publish
// types only through `exports`). esbuild and vitest resolve the real subpaths at build and run time.
// Delete this file if the root tsconfig moves to `node16`/`bundler` resolution.
declare module 'vscode-languageserver/node' {
  export * from 'vscode-languageserver/lib/node/main';
}
declare module 'vscode-languageserver-protocol' {
  export * from 'vscode-languageserver-protocol/lib/common/api';
}
declare module 'vscode-languageserver-protocol/node' {
  export * from 'vscode-languageserver-protocol/lib/node/main';
}
declare module 'vscode-jsonrpc' {
  export * from 'vscode-jsonrpc/lib/common/api';
}
declare module 'vscode-jsonrpc/node' {
  export * from 'vscode-jsonrpc/lib/node/main';
}
