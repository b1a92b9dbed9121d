// Node options the editor starts the language server with. Shared with the protocol tests and the
// benchmarks, which start the server (or time the engine) the way the editor does.
//
// A larger young generation: an analysis of a large spec builds a few MB of syntax tree and model
// that all stay alive until it ends, and with V8's default young generation (16 MB semi-spaces)
// a collection copied them in most analyses. Measured with npm run bench's cold 200-channel figure
// (6,000 lines), six processes per setting, alternated, on this project's shared 2-core machine:
// medians of about 24 ms with the default, 18 ms with 32 MB, 31 ms with 64 MB (larger semi-spaces
// cost more per collection). It reserves at most about 100 MB more, used only as needed.
export const SERVER_NODE_FLAGS: readonly string[] = ['--max-semi-space-size=32'];
