// Renders a chart spec (spec.ts) to SVG text in Node, without a browser: Vega's headless view
// (renderer 'none') and its SVG string output (vega.github.io/vega/usage/#node). Expressions go
// through vega-interpreter, the same evaluator the editor panel uses under its strict CSP.
// Vega is loaded on the first render, not when the CLI or the language server starts.
import type { Spec } from 'vega';
import type { VegaSpec } from './spec';

export async function renderSvg(spec: VegaSpec): Promise<string> {
  const [{ View, parse }, { expressionInterpreter }] = await Promise.all([import('vega'), import('vega-interpreter')]);
  const view = new View(parse(spec as Spec, undefined, { ast: true }), { renderer: 'none', expr: expressionInterpreter });
  try {
    return await view.toSVG();
  } finally {
    view.finalize();
  }
}
