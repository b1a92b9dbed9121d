import { describe, expect, it } from 'vitest';
import { findGeneratedBlocks, renderBlock, scanGeneratedBlocks, spliceGenerated } from '../../../server/src/codegen/markers';

const blk = (channel: string, hash: string, text: string) => ({ channel, hash, text });

describe('spliceGenerated', () => {
  const user = '/* my firmware */\n#include "conv.h"\nint keep_me(void) { return 1; }\n';

  it('appends absent blocks and leaves the user text byte-identical', () => {
    const r = spliceGenerated(user, [blk('tank', 'aa11', 'int tank_x;\n')]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.text.startsWith(user)).toBe(true);
    const found = findGeneratedBlocks(r.text);
    expect(found).toHaveLength(1);
    expect(found[0]).toMatchObject({ channel: 'tank', hash: 'aa11' });
    expect(r.text.slice(found[0]!.bodyStart, found[0]!.bodyEnd)).toBe('int tank_x;\n');
  });

  it('replaces only the block between its markers, with the new hash', () => {
    const before = 'head\n';
    const middle = '\n/* between */\n';
    const after = 'tail without newline';
    const text = before + renderBlock(blk('a', 'h1', 'old a\n')) + middle + renderBlock(blk('b', 'h2', 'old b\n')) + after;
    const r = spliceGenerated(text, [blk('b', 'h3', 'new b\n'), blk('a', 'h1', 'new a\n')]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.text).toBe(before + renderBlock(blk('a', 'h1', 'new a\n')) + middle + renderBlock(blk('b', 'h3', 'new b\n')) + after);
    expect(findGeneratedBlocks(r.text).map((b) => [b.channel, b.hash])).toEqual([['a', 'h1'], ['b', 'h3']]);
  });

  it('is idempotent and keeps CRLF files CRLF', () => {
    const crlf = 'x\r\ny\r\n';
    const once = spliceGenerated(crlf, [blk('c h', 'h', 'body\n')]);
    expect(once.ok).toBe(true);
    if (!once.ok) return;
    expect(once.text.replace(/\r\n/g, '')).not.toContain('\n');
    const twice = spliceGenerated(once.text, [blk('c h', 'h', 'body\n')]);
    expect(twice).toEqual(once);
  });

  it('round-trips hostile channel names through the markers', () => {
    const name = 'tank */ #1 é ??/ "q"\nx';
    const r = spliceGenerated('', [blk(name, 'h*/', 'b\n')]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const lines = r.text.split('\n');
    expect(lines[0]!.indexOf('*/')).toBe(lines[0]!.length - 2); // only the marker's own closer
    expect(findGeneratedBlocks(r.text)[0]).toMatchObject({ channel: name, hash: 'h*/' });
  });

  const damaged: [string, string, RegExp][] = [
    ['begin without end', `${renderBlock(blk('a', 'h', 'x\n')).split('\n')[0]}\nint y;\n`, /no end marker/],
    ['end without begin', `int y;\n/* thermoscribe:end channel=a */\n`, /without a begin/],
    ['nested', renderBlock(blk('a', 'h', `${renderBlock(blk('b', 'h', 'x\n'))}`)), /nested/],
    ['duplicated', renderBlock(blk('a', 'h', 'x\n')) + renderBlock(blk('a', 'h', 'y\n')), /second generated block/],
    ['mangled marker', '/* thermoscribe:begin channel=a spec= */\n', /damaged marker/],
    ['mismatched end', `${renderBlock(blk('a', 'h', 'x\n')).split('\n')[0]}\n/* thermoscribe:end channel=b */\n`, /names channel "b"/],
  ];
  for (const [what, text, msg] of damaged) {
    it(`refuses ${what} with a located message and changes nothing`, () => {
      const r = spliceGenerated(text, [blk('a', 'new', 'z\n')]);
      expect(r.ok).toBe(false);
      if (r.ok) return;
      expect(r.message).toMatch(msg);
      expect(r.message).toMatch(/nothing was changed/);
      expect(r.offset).toBeGreaterThanOrEqual(0);
      expect(r.offset).toBeLessThanOrEqual(text.length);
      expect(scanGeneratedBlocks(text).problems.length).toBeGreaterThan(0);
    });
  }

  it('refuses the same channel twice in one request', () => {
    const r = spliceGenerated('', [blk('a', 'h', 'x'), blk('a', 'h', 'y')]);
    expect(r.ok).toBe(false);
  });
});
