// Node options the editor starts the language server with. Shared with the protocol tests and the
// benchmarks, which start the server (or time the engine) the way the editor does.
//
// A larger young generation: an analysis of a large spec builds a few MB of syntax tree and model
// that all stay alive until it ends, and V8's default young generation (16 MB semi-spaces, grown
// from 1 MB) made a collection copy them in most analyses. Measured with a 200-channel spec (6,000
// lines), median of 60 cold analyses, alternated runs on this project's 2-core machine: about
// 34 ms with the default, 21 ms with 32 MB. It reserves at most about 100 MB more, used only
// as needed.
export const SERVER_NODE_FLAGS: readonly string[] = ['--max-semi-space-size=32'];
