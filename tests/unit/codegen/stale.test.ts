// Stale generated blocks: the spec hash in a block's marker is of the channel's own resolved
// inputs, so editing the channel makes its block stale while reformatting the spec or editing
// another channel does not. The spec is invented (tests/fixtures/codegen/gen/pump.tsense); the
// expected behaviour is this project's own design (no outside source applies).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { channelSpecHash, conversionFilePath } from '../../../server/src/codegen/channel-input';
import { generateForSpec } from '../../../server/src/codegen/spec';
import { staleBlocks, staleDiagnostics } from '../../../server/src/codegen/stale';
import { FIXTURES } from '../helpers/fixtures';

const SPEC = path.join(FIXTURES, 'codegen', 'gen', 'pump.tsense');
const TEXT = fs.readFileSync(SPEC, 'utf8');
const run = (text: string) => analyse({ path: SPEC, text });
const hashes = (text: string) => Object.fromEntries(run(text).channels.map((r) => [r.channel.name, channelSpecHash(r.channel)]));

function generated(text: string): string {
  const g = generateForSpec(run(text), { fileStem: 'pump_conversion' });
  if (!g.ok) throw new Error(g.message);
  return g.source.text;
}

describe('channel spec hash', () => {
  const base = hashes(TEXT);

  it('ignores layout, comments and the other channels', () => {
    expect(hashes(TEXT.replace(/ {2,}=/g, ' =').replace('# Invented', '# Still invented'))).toEqual(base);
    const otherEdited = hashes(TEXT.replace('range  = -20 °C .. 60 °C', 'range  = -25 °C .. 60 °C'));
    expect(otherEdited['coolant']).toBe(base['coolant']);
    expect(otherEdited['housing']).not.toBe(base['housing']);
  });

  it('follows the channel, its sensor and its ADC, and its code options', () => {
    expect(hashes(TEXT.replace('code_error = 0.2 °C', 'code_error = 0.3 °C'))['coolant']).not.toBe(base['coolant']);
    const adc = hashes(TEXT.replace('reference  = 1.1 V', 'reference  = 1.2 V'));
    expect(adc['coolant']).not.toBe(base['coolant']);
    expect(adc['housing']).not.toBe(base['housing']);
  });
});

describe('staleBlocks / staleDiagnostics', () => {
  const c = generated(TEXT);

  it('finds no stale block in freshly generated code', () => {
    expect(staleBlocks(c, run(TEXT))).toEqual([]);
  });

  it('flags only the edited channel, with a generated-stale warning on its name', () => {
    const edited = TEXT.replace('bias       = current 20 uA', 'bias       = current 25 uA');
    const a = run(edited);
    const stale = staleBlocks(c, a);
    expect(stale.map((s) => s.block.channel)).toEqual(['coolant']);
    expect(stale[0]!.currentHash).toBe(channelSpecHash(a.channels[0]!.channel));
    const d = staleDiagnostics(a, (p) => (p === conversionFilePath(SPEC) ? c : undefined));
    expect(d).toHaveLength(1);
    expect(d[0]).toMatchObject({ code: 'generated-stale', severity: 'warning', data: { channel: 'coolant' } });
    expect(edited.slice(d[0]!.span.start, d[0]!.span.end)).toBe('coolant');
    expect(d[0]!.message).toMatch(/^the generated code for 'coolant' in pump_conversion\.c was made from an earlier version of this channel \(spec [0-9a-f]{8}, now [0-9a-f]{8}\); regenerate it$/);
  });

  it('says nothing without a C file, for blocks of unknown channels, or for damaged markers', () => {
    const a = run(TEXT.replace('bias       = current 20 uA', 'bias       = current 25 uA'));
    expect(staleDiagnostics(a, () => undefined)).toEqual([]);
    const renamed = c.replace(/channel=coolant/g, 'channel=gone');
    expect(staleBlocks(renamed, a)).toEqual([]);
    const broken = c.replace('/* thermoscribe:end channel=coolant */', '');
    expect(() => staleBlocks(broken, a)).not.toThrow();
  });

  it('reports a block of a channel the spec no longer defines as generated-orphan (#13 item 10)', () => {
    const a = run(TEXT.replace('channel housing {', 'channel casing {'));
    const d = staleDiagnostics(a, (p) => (p === conversionFilePath(SPEC) ? c : undefined));
    expect(d.map((x) => [x.code, x.data?.channel])).toEqual([['generated-orphan', 'housing']]);
    expect(d[0]!.message).toContain("pump_conversion.c holds a generated block for 'housing', a channel this spec does not define");
    // Without the spec's files (the caller cannot say which channels it defines): no orphan.
    expect(staleDiagnostics({ path: a.path, channels: a.channels }, (p) => (p === conversionFilePath(SPEC) ? c : undefined))).toEqual([]);
  });
});
