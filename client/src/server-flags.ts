// Node options the editor starts the language server with. Shared with the protocol tests and the
// benchmarks, which start the server (or time the engine) the way the editor does.
//
// A larger young generation: an analysis of a large spec builds a few MB of syntax tree and model
// that all stay alive until it ends, and with V8's default young generation (16 MB semi-spaces)
// a collection copies them in most analyses. Measured with npm run bench's cold 200-channel figure
// (6,000 lines), five processes per setting, alternated, on this project's shared 2-core machine:
// median 21 ms with the default, 17 ms with 32 MB, 11 ms with 64 MB (figures move by up to 2x
// with the machine's load). 32 MB meets the 20 ms target and reserves at most about 100 MB more,
// half of what 64 MB would; the memory is used only as needed.
export const SERVER_NODE_FLAGS: readonly string[] = ['--max-semi-space-size=32'];
