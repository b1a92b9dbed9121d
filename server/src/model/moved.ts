// Definitions of blocks that only moved in the document (an edit above them changed the length of
// the text): the same inputs at new offsets. A moved copy keeps the content token of the
// definition it was copied from, so sweeps and budgets derived from that content are kept.
import { shiftOffsets } from '../syntax/shift';

const TOKEN = new WeakMap<object, object>();

/** An object standing for the definition's content (its position aside): equal tokens, equal inputs. */
export function contentToken(def: object): object {
  return TOKEN.get(def) ?? def;
}

/** Marks `copy` as having the same content as `of`. */
export function sameContent(copy: object, of: object): void {
  TOKEN.set(copy, contentToken(of));
}

/** A copy of a definition (or diagnostics) with every offset moved by `by`; same content token. */
export function movedCopy<T extends object>(def: T, by: number): T {
  if (by === 0) return def;
  const copy = shiftOffsets(def, by);
  sameContent(copy, def);
  return copy;
}
