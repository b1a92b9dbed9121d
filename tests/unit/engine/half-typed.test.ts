// Half-typed values get messages that ask for what is missing (issue #14 item 5): one fixture per
// field form (quantity, range, choice, ref, bias, resolution, accuracy, phrases) under
// tests/fixtures/half-typed/, its diagnostics in the .expected file beside it. The messages come
// from the grammar (grammar/tsense.peggy: RangeEnd, ToleranceAmount) and the value readers
// (model/read-value.ts askForRest, schema.ts HALF_TYPED). The forms are the project's own syntax;
// no outside source applies.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyseFile, diagnosticRows, expectMatchesFile, FIXTURES } from '../helpers/fixtures';

const DIR = path.join(FIXTURES, 'half-typed');
const FORMS = ['quantity', 'range', 'choice', 'ref', 'bias', 'resolution', 'accuracy', 'phrase'];

describe('half-typed values ask for what is missing', () => {
  it('has a fixture for every field form', () => {
    expect(fs.readdirSync(DIR).filter((f) => f.endsWith('.tsense')).map((f) => f.replace('.tsense', '')).sort()).toEqual([...FORMS].sort());
  });
  for (const form of FORMS) {
    it(form, () => {
      const rows = diagnosticRows(analyseFile(path.join(DIR, `${form}.tsense`)), DIR);
      expectMatchesFile(rows.join('\n') + '\n', path.join(DIR, `${form}.expected`));
    });
  }
  it('the issue\'s example: `range = 0 °C .. ` asks for the upper end', () => {
    const rows = diagnosticRows(analyseFile(path.join(DIR, 'range.tsense')), DIR).join('\n');
    expect(rows).toContain('syntax error');
    expect(rows).toMatch(/expected the upper end of a range, such as 125 °C, found the end of the line/);
    expect(rows).not.toMatch(/expected a comment|found "\."/);
  });
  it('no half-typed form gets the generic parser message; an empty value is asked for the forms its field takes', () => {
    for (const form of FORMS) {
      const rows = diagnosticRows(analyseFile(path.join(DIR, `${form}.tsense`)), DIR).join('\n');
      expect(rows, form).not.toMatch(/expected a value such as|expected a comment/);
    }
    const choice = diagnosticRows(analyseFile(path.join(DIR, 'choice.tsense')), DIR).join('\n');
    expect(choice).toContain('conversion has no value: give `table` or `line`');
    const ref = diagnosticRows(analyseFile(path.join(DIR, 'ref.tsense')), DIR).join('\n');
    expect(ref).toContain('sensor has no value: give the name of');
    expect(ref).not.toContain("needs 'sensor'"); // written without a value is not missing
    const bias = diagnosticRows(analyseFile(path.join(DIR, 'bias.tsense')), DIR).join('\n');
    expect(bias).toContain("add 'from' and the supply voltage after the resistance, such as `resistor 47k from 3.3 V`");
  });
});
