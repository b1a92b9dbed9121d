// Moving things written at one place of a document to another: a copy with every offset moved.
// Spans ({ start, end }) are the only objects with `start` and `end` keys in syntax trees, resolved
// definitions and diagnostics, so every numeric `start`/`end` is an offset.

/** A deep copy of plain data (objects and arrays) with every numeric `start` and `end` moved by `by`. */
export function shiftOffsets<T>(value: T, by: number): T {
  return shift(value, by) as T;
}

function shift(node: unknown, by: number): unknown {
  if (Array.isArray(node)) {
    const out = new Array<unknown>(node.length);
    for (let i = 0; i < node.length; i++) out[i] = shift(node[i], by);
    return out;
  }
  if (node === null || typeof node !== 'object') return node;
  const src = node as Record<string, unknown>;
  const out: Record<string, unknown> = {};
  for (const k in src) {
    const v = src[k];
    out[k] = (k === 'start' || k === 'end') && typeof v === 'number' ? v + by : typeof v === 'object' && v !== null ? shift(v, by) : v;
  }
  return out;
}
