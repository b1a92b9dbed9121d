// Every diagnostic code has a fixture that triggers it and one that does not
// (tests/fixtures/diagnostics/<code>.fires.tsense / <code>.quiet.tsense); each fixture's full
// diagnostic list is compared with its .expected file.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { CATALOGUE, type DiagnosticCode } from '../../../server/src/diagnostics/catalogue';
import { analyseFile, diagnosticRows, expectMatchesFile, FIXTURES } from '../helpers/fixtures';

const DIR = path.join(FIXTURES, 'diagnostics');
// clip-low needs a sensed voltage below 0 V, which no forward-biased junction produces; it is
// covered by a unit test on a synthetic sweep in clip-low.test.ts.
// generated-stale compares a spec with the C file beside it, outside analyse(): covered by
// tests/unit/codegen/stale.test.ts and tests/protocol/conversion.test.ts.
// generated-orphan likewise: covered by tests/unit/codegen/stale.test.ts.
const NO_SPEC_FIXTURE = new Set<DiagnosticCode>(['clip-low', 'generated-stale', 'generated-orphan']);

describe('diagnostic fixtures', () => {
  const codes = (Object.keys(CATALOGUE) as DiagnosticCode[]).filter((c) => !NO_SPEC_FIXTURE.has(c));
  it('exist for every catalogue code', () => {
    const missing = codes.filter((c) => !fs.existsSync(path.join(DIR, `${c}.fires.tsense`)) || !fs.existsSync(path.join(DIR, `${c}.quiet.tsense`)));
    expect(missing).toEqual([]);
  });
  for (const code of codes) {
    it(`${code}: fires`, () => {
      const file = path.join(DIR, `${code}.fires.tsense`);
      const a = analyseFile(file, DIR);
      expect(a.diagnostics.map((d) => d.code)).toContain(code);
      expectMatchesFile(diagnosticRows(a, DIR).join('\n') + '\n', file.replace(/\.tsense$/, '.expected'));
    });
    it(`${code}: quiet`, () => {
      const file = path.join(DIR, `${code}.quiet.tsense`);
      const a = analyseFile(file, DIR);
      expect(a.diagnostics.map((d) => d.code)).not.toContain(code);
      if (code !== 'more-problems') expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
      expectMatchesFile(diagnosticRows(a, DIR).join('\n') + '\n', file.replace(/\.tsense$/, '.expected'));
    });
  }
});
