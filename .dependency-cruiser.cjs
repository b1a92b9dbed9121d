// Import-boundary rules (dependency-cruiser): imports flow one way, from the editor and CLI down to
// the syntax tree. A module may import its own layer or any layer below it, never one above.
// The layer order is written down in DEVELOPERS.md ("Layers"); change both together.
const LAYERS = [
  // Leaves: the syntax tree, the physics and the diagnostic catalogue import nothing above them.
  ['leaves', ['server/src/syntax/', 'server/src/physics/', 'server/src/diagnostics/']],
  ['model', ['server/src/model/']],
  ['analysis', ['server/src/analysis/']],
  ['calibration', ['server/src/calibration/']],
  ['budget', ['server/src/budget/']],
  ['checks', ['server/src/checks/']],
  ['sensor kinds', ['server/src/sensors/']],
  ['products', ['server/src/codegen/', 'server/src/plot/', 'server/src/compare/', 'server/src/report/']],
  ['language features', ['server/src/features/']],
  ['engine façade', ['server/src/engine\\.ts$', 'server/src/document-state\\.ts$']],
  ['front ends', ['server/src/lsp/', 'server/src/cli/', 'server/src/disk\\.ts$']],
];

// The sensor-kind contract: `sensors/registry.ts` (the kinds' dispatch table, which imports no kind)
// and `sensors/kind.ts` (the interface every kind implements) sit in the model layer, so the generic
// layers call the kinds through them without importing upward. The interface names types of the
// layers that call it (the check context, the analysis result): those imports must be type-only
// (erased when compiled), the rule `kind-contract-types-only` below holds it to that, and the cycles
// they close are not counted (nothing runs along them).
const CONTRACT = ['server/src/sensors/registry\\.ts$', 'server/src/sensors/kind\\.ts$'];
const KIND_INTERFACE = '^server/src/sensors/kind\\.ts$';
const layerOf = (name) => (name === 'model' ? CONTRACT : []);

const escape = (p) => '^' + p;
const forbidden = [];
LAYERS.forEach(([name, paths], i) => {
  const above = LAYERS.slice(i + 1).flatMap(([, ps]) => ps);
  if (above.length === 0) return;
  forbidden.push({
    name: `upward-from-${name.replace(/[^a-z]+/g, '-')}`,
    severity: 'error',
    comment: `${name} may import only its own layer and the layers below it (DEVELOPERS.md, "Layers").`,
    from: { path: [...paths, ...layerOf(name)].map(escape), pathNot: [KIND_INTERFACE] },
    to: { path: above.map(escape), pathNot: LAYERS.slice(0, i + 1).flatMap(([n]) => layerOf(n)).map(escape) },
  });
});

forbidden.push({
  name: 'kind-contract-types-only',
  severity: 'error',
  comment: 'The sensor-kind interface (sensors/kind.ts) may name types of the layers above the model, but import nothing from them that runs.',
  from: { path: KIND_INTERFACE },
  to: { path: LAYERS.slice(2).flatMap(([, ps]) => ps).map(escape), dependencyTypesNot: ['type-only'] },
});

forbidden.push({
  name: 'front-ends-through-facade',
  severity: 'error',
  comment: 'The CLI and the language server reach the engine only through its façade (server/src/engine.ts).',
  from: { path: ['^server/src/lsp/', '^server/src/cli/'] },
  to: { path: '^server/src/', pathNot: ['^server/src/lsp/', '^server/src/cli/', '^server/src/engine\\.ts$', '^server/src/disk\\.ts$'] },
});

forbidden.push({
  name: 'no-file-cycles',
  severity: 'error',
  comment: 'Files that import each other in a circle.',
  from: { path: '^server/src/' },
  to: { circular: true, viaOnly: { pathNot: KIND_INTERFACE } },
});

forbidden.push({
  name: 'engine-has-no-editor-types',
  severity: 'error',
  comment: 'The engine imports nothing from the editor or the protocol library; only server/src/lsp/ and client/ do.',
  from: { path: '^server/src/', pathNot: '^server/src/lsp/' },
  to: { path: ['node_modules/vscode-languageserver', 'node_modules/vscode-languageclient', '^vscode$'] },
});

module.exports = {
  forbidden,
  options: {
    doNotFollow: { path: 'node_modules' },
    tsPreCompilationDeps: true,
    tsConfig: { fileName: 'tsconfig.json' },
    exclude: { path: ['parser\\.generated'] },
  },
};
