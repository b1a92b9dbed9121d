// A channel's `code_prefix` (issue #13 item 12): every identifier generated for the channel starts
// with it, whichever way the code is made (CLI `gen`, the editor's generate and insert actions),
// and changing it makes the generated block stale. The spec is invented
// (tests/fixtures/codegen/gen/pump.tsense); the behaviour is this project's own design.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { runGen } from '../../../server/src/cli/commands/gen';
import { conversionFilePath } from '../../../server/src/codegen/channel-input';
import { conversionBlock, generateForSpec } from '../../../server/src/codegen/spec';
import { staleDiagnostics } from '../../../server/src/codegen/stale';
import { generateForChannel } from '../../../server/src/features/generate-code';
import { FIXTURES } from '../helpers/fixtures';

const SPEC = path.join(FIXTURES, 'codegen', 'gen', 'pump.tsense');
const TEXT = fs.readFileSync(SPEC, 'utf8');
const PREFIXED = TEXT.replace('  code_method = table\n', '  code_method = table\n  code_prefix = pa_\n');
const run = (text: string) => analyse({ path: SPEC, text });

describe('code_prefix', () => {
  it('is read from the channel; an unusable one gets a message with the rule', () => {
    expect(PREFIXED).not.toBe(TEXT);
    const a = run(PREFIXED);
    expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(a.channels.find((r) => r.channel.name === 'coolant')!.channel.codegen?.prefix).toBe('pa_');
    const bad = run(TEXT.replace('  code_method = table\n', '  code_method = table\n  code_prefix = _pa\n'));
    const d = bad.diagnostics.find((x) => x.severity === 'error');
    expect(d?.message).toBe("code_prefix must be a C identifier of 1 to 32 letters, digits and underscores starting with a letter (got '_pa'), such as `boiler_`");
  });

  it('names the same identifiers in gen, the generate action and the insert action', () => {
    const a = run(PREFIXED);
    const gen = generateForSpec(a, { fileStem: 'pump_conversion' });
    if (!gen.ok) throw new Error(gen.message);
    expect(gen.source.channels.map((c) => c.identifier)).toEqual(['pa_coolant', 'housing']);
    expect(gen.header.text).toContain('uint8_t pa_coolant_code_to_temp(uint16_t code, pa_coolant_temp_t *out);');
    expect(gen.header.text).toContain('#define PA_COOLANT_SCALE 10 ');
    const action = generateForChannel(a, 'coolant', undefined);
    if (!action.ok) throw new Error(action.message);
    expect(action.result.text).toContain('uint8_t pa_coolant_code_to_temp(uint16_t code, pa_coolant_temp_t *out)');
    expect(action.result.text).not.toMatch(/\bcoolant_code_to_temp\b/);
    const inserted = conversionBlock(a, 'coolant');
    if (!inserted.ok) throw new Error(inserted.message);
    expect(inserted.text).toContain('pa_coolant_points');
  });

  it('wins over gen --prefix, which names the channels without one', () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-prefix-'));
    try {
      fs.writeFileSync(path.join(dir, 'pump.tsense'), PREFIXED);
      let err = '';
      const code = runGen(['pump.tsense', '--prefix', 'zz_'], { out: () => undefined, err: (t) => (err += t), cwd: dir });
      expect(err).toBe('');
      expect(code).toBe(0);
      const h = fs.readFileSync(path.join(dir, 'pump_conversion.h'), 'utf8');
      expect(h).toContain('pa_coolant_code_to_temp(');
      expect(h).toContain('zz_housing_code_to_temp(');
      expect(h).not.toContain('zz_pa_');
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it('makes the block stale when it changes (the names in the block change with it)', () => {
    const gen = generateForSpec(run(TEXT), { fileStem: 'pump_conversion' });
    if (!gen.ok) throw new Error(gen.message);
    const read = (p: string) => (p === conversionFilePath(SPEC) ? gen.source.text : undefined);
    expect(staleDiagnostics(run(TEXT), read)).toEqual([]);
    const d = staleDiagnostics(run(PREFIXED), read);
    expect(d.map((x) => [x.code, x.data?.channel])).toEqual([['generated-stale', 'coolant']]);
  });
});
