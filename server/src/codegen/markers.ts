// Begin/end markers around each channel's generated block, and splicing new blocks into a file
// that may also hold hand-written code. Offsets are UTF-16 code units (JavaScript string indices).

import { decodeMarkerField, encodeMarkerField } from './names';
import type { FoundBlock, SpliceBlock, SpliceResult } from './types';

const TAG_BEGIN = 'thermoscribe:begin';
const TAG_END = 'thermoscribe:end';
const BEGIN_RE = /^[ \t]*\/\* thermoscribe:begin channel=(\S+) spec=(\S+) [^*]*\*\/[ \t]*$/;
const END_RE = /^[ \t]*\/\* thermoscribe:end channel=(\S+) \*\/[ \t]*$/;

export function beginMarker(channel: string, hash: string): string {
  return `/* ${TAG_BEGIN} channel=${encodeMarkerField(channel)} spec=${encodeMarkerField(hash)} (generated: edits between these markers are replaced) */`;
}

export function endMarker(channel: string): string {
  return `/* ${TAG_END} channel=${encodeMarkerField(channel)} */`;
}

/** The full block text (markers included) for a channel body. */
export function renderBlock(block: SpliceBlock, eol = '\n'): string {
  let body = block.text.replace(/\r\n?/g, '\n');
  if (body.length > 0 && !body.endsWith('\n')) body += '\n';
  const text = `${beginMarker(block.channel, block.hash)}\n${body}${endMarker(block.channel)}\n`;
  return eol === '\n' ? text : text.replace(/\n/g, eol);
}

export interface MarkerProblem {
  message: string;
  offset: number;
}

interface Line {
  start: number;
  /** Offset past the line's terminator. */
  next: number;
  text: string;
}

function lines(text: string): Line[] {
  const out: Line[] = [];
  const re = /\r\n|\r|\n/g;
  let start = 0;
  for (let m = re.exec(text); m; m = re.exec(text)) {
    out.push({ start, next: m.index + m[0].length, text: text.slice(start, m.index) });
    start = m.index + m[0].length;
  }
  if (start < text.length) out.push({ start, next: text.length, text: text.slice(start) });
  return out;
}

/** All well-formed blocks plus every marker problem (damaged, unpaired, nested, duplicated). */
export function scanGeneratedBlocks(text: string): { blocks: FoundBlock[]; problems: MarkerProblem[] } {
  const blocks: FoundBlock[] = [];
  const problems: MarkerProblem[] = [];
  const seen = new Map<string, number>();
  let open: { channel: string; hash: string; line: Line } | undefined;
  for (const line of lines(text)) {
    const hasBegin = line.text.includes(TAG_BEGIN);
    const hasEnd = line.text.includes(TAG_END);
    if (!hasBegin && !hasEnd) continue;
    const b = BEGIN_RE.exec(line.text);
    const e = END_RE.exec(line.text);
    if (hasBegin && b) {
      const channel = decodeMarkerField(b[1] ?? '');
      const hash = decodeMarkerField(b[2] ?? '');
      if (channel === undefined || hash === undefined) {
        problems.push({ message: 'damaged begin marker: channel or spec field is not decodable', offset: line.start });
        continue;
      }
      if (open) {
        problems.push({
          message: `begin marker for channel "${channel}" inside the still-open block of channel "${open.channel}" (nested blocks; is an end marker missing?)`,
          offset: line.start,
        });
        continue;
      }
      open = { channel, hash, line };
    } else if (hasEnd && e) {
      const channel = decodeMarkerField(e[1] ?? '');
      if (channel === undefined) {
        problems.push({ message: 'damaged end marker: channel field is not decodable', offset: line.start });
        continue;
      }
      if (!open) {
        problems.push({ message: `end marker for channel "${channel}" without a begin marker before it`, offset: line.start });
        continue;
      }
      if (channel !== open.channel) {
        problems.push({
          message: `end marker names channel "${channel}" but the open block is channel "${open.channel}"`,
          offset: line.start,
        });
        open = undefined;
        continue;
      }
      const first = seen.get(channel);
      if (first !== undefined) {
        problems.push({
          message: `channel "${channel}" has a second generated block (the first begins at offset ${first})`,
          offset: open.line.start,
        });
      } else {
        seen.set(channel, open.line.start);
        blocks.push({
          channel,
          hash: open.hash,
          start: open.line.start,
          end: line.next,
          bodyStart: open.line.next,
          bodyEnd: line.start,
        });
      }
      open = undefined;
    } else {
      problems.push({
        message: `damaged marker line (expected "/* ${hasBegin ? TAG_BEGIN : TAG_END} channel=... ${hasBegin ? 'spec=... ' : ''}*/" alone on its line)`,
        offset: line.start,
      });
    }
  }
  if (open) {
    problems.push({ message: `begin marker for channel "${open.channel}" has no end marker`, offset: open.line.start });
  }
  return { blocks, problems };
}

/** Well-formed generated blocks in `text` (use scanGeneratedBlocks for the problems too). */
export function findGeneratedBlocks(text: string): FoundBlock[] {
  return scanGeneratedBlocks(text).blocks;
}

/**
 * Replaces each block's region (markers included, so the new hash is written) and appends blocks
 * that are absent. Text outside the markers is never changed. Any damaged marker refuses the
 * whole splice and reports where.
 */
export function spliceGenerated(existing: string, blocks: readonly SpliceBlock[]): SpliceResult {
  const { blocks: found, problems } = scanGeneratedBlocks(existing);
  const first = problems[0];
  if (first) {
    return { ok: false, message: `${first.message}; nothing was changed`, offset: first.offset };
  }
  const names = new Set<string>();
  for (const b of blocks) {
    if (names.has(b.channel)) {
      return { ok: false, message: `channel "${b.channel}" given twice to splice; nothing was changed`, offset: 0 };
    }
    names.add(b.channel);
  }
  const crlf = (existing.match(/\r\n/g)?.length ?? 0) * 2 > (existing.match(/\n/g)?.length ?? 0);
  const eol = crlf ? '\r\n' : '\n';
  const byChannel = new Map(found.map((f) => [f.channel, f]));
  const replacements: { start: number; end: number; text: string }[] = [];
  const appended: string[] = [];
  for (const b of blocks) {
    const f = byChannel.get(b.channel);
    if (f) {
      // Keep the original absence of a final newline when the block closes the file.
      let text = renderBlock(b, eol);
      if (f.end === existing.length && !/[\r\n]$/.test(existing)) text = text.slice(0, -eol.length);
      replacements.push({ start: f.start, end: f.end, text });
    } else {
      appended.push(renderBlock(b, eol));
    }
  }
  replacements.sort((a, b) => b.start - a.start);
  let text = existing;
  for (const r of replacements) text = text.slice(0, r.start) + r.text + text.slice(r.end);
  if (appended.length > 0) {
    if (text.length > 0 && !/[\r\n]$/.test(text)) text += eol;
    if (text.length > 0) text += eol;
    text += appended.join(eol);
  }
  return { ok: true, text };
}

/**
 * Generated blocks of `text` whose channel is not in `channels` (the channel was removed or
 * renamed in the spec): their names, and the text without them when `prune` is set. Only whole
 * blocks, markers included, are removed; everything else is kept byte for byte.
 */
export function orphanBlocks(text: string, channels: ReadonlySet<string>, prune = false): { orphans: FoundBlock[]; text: string } {
  const orphans = scanGeneratedBlocks(text).blocks.filter((b) => !channels.has(b.channel));
  if (!prune || orphans.length === 0) return { orphans, text };
  let out = '';
  let at = 0;
  for (const b of orphans) {
    out += text.slice(at, b.start);
    at = b.end;
  }
  return { orphans, text: out + text.slice(at) };
}
