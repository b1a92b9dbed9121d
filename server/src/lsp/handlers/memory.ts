// Custom request for the bench's memory figure (bench/lsp.ts):
//   thermoscribe/memory {} -> {rss, heapUsed, heapTotal, external, collected}
// Bytes, after a full collection when the server runs with node's --expose-gc (`collected` says
// whether it did), so that the figure is what is kept, not garbage not yet collected.
export const MEMORY = 'thermoscribe/memory';

export interface MemoryResult {
  rss: number;
  heapUsed: number;
  heapTotal: number;
  external: number;
  collected: boolean;
}

export function onMemory(): MemoryResult {
  const gc = (globalThis as { gc?: () => void }).gc;
  if (gc) {
    gc();
    gc();
  }
  const m = process.memoryUsage();
  return { rss: m.rss, heapUsed: m.heapUsed, heapTotal: m.heapTotal, external: m.external, collected: gc !== undefined };
}
