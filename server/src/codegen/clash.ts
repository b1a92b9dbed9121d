// Two channels whose names differ (markers keep every character) can still map to one C
// identifier (identifiers are lowercased ASCII: `ch` and `Ch` both give `ch`). Within one run the
// generator numbers them apart (names.ts, uniqueIdentifiers); across runs into one file it cannot
// see the other spec, so a file that already holds another channel's block with the same C names
// is refused rather than written into something that no longer compiles.
import { scanGeneratedBlocks } from './markers';
import { shown } from '../diagnostics/shown';

/** The identifier prefix a generated block defines, read from its conversion function. */
const DEFINES = /^uint8_t ([a-z][a-z0-9_]*)_code_to_temp\(/m;

/**
 * Why adding or replacing `incoming` blocks in `existing` would define a C name twice, or
 * undefined. `identifier` is the prefix the generator gave the incoming channel.
 */
export function symbolClash(existing: string, incoming: readonly { channel: string; identifier: string }[]): string | undefined {
  const names = new Set(incoming.map((b) => b.channel));
  for (const found of scanGeneratedBlocks(existing).blocks) {
    if (names.has(found.channel)) continue;
    const id = DEFINES.exec(existing.slice(found.bodyStart, found.bodyEnd))?.[1];
    const other = id === undefined ? undefined : incoming.find((b) => b.identifier === id);
    if (other) {
      return `channel '${shown(other.channel)}' would define the same C names (${id}_...) as channel '${shown(found.channel)}' already in the file; rename one of the channels, or generate them into different files with --out`;
    }
  }
  return undefined;
}
