import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { commentLines, identifierStem, uniqueIdentifiers } from '../../../server/src/codegen/names';

// C identifier syntax and keywords: ISO/IEC 9899:1999 6.4.1 (keywords) and 6.4.2 (identifiers);
// identifiers starting with "_" + capital or "__" are reserved (7.1.3).
const C_IDENT = /^[a-z][a-z0-9_]*$/;

describe('identifiers from channel names', () => {
  it('makes valid C identifiers from hostile names', () => {
    expect(identifierStem('Board junction #1')).toBe('board_junction_1');
    expect(identifierStem('Température cuve')).toBe('temperature_cuve');
    expect(identifierStem('42 probe')).toBe('ch_42_probe');
    expect(identifierStem('int')).toBe('int_ch');
    expect(identifierStem('*/ evil /*')).toBe('evil');
    expect(identifierStem('')).toBe('channel');
    expect(identifierStem('__Reserved')).toBe('reserved');
  });

  it('always yields a C99 identifier of bounded length (property, ISO C 6.4.2)', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 80 }), (s) => {
        const id = identifierStem(s);
        return C_IDENT.test(id) && id.length <= 35 && !id.includes('__');
      }),
    );
  });

  it('keeps identifiers unique in order', () => {
    expect(uniqueIdentifiers(['A b', 'a-b', 'a_b'])).toEqual(['a_b', 'a_b_2', 'a_b_3']);
  });
});

describe('comment text from spec notes', () => {
  it('cannot close a comment, form a trigraph or splice a line', () => {
    const lines = commentLines('ok */ int x; /* ??/\nnext line\\\r\n\u00e9t\u00e9 \u2603 ?? //');
    const joined = lines.join('\n');
    expect(joined).not.toContain('*/');
    expect(joined).not.toContain('/*');
    expect(joined).not.toContain('??');
    expect(joined).not.toContain('\\');
    expect(lines.length).toBe(3);
    expect(lines[2]).toContain('ete');
  });

  it('emits printable ASCII only and never a delimiter (property)', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 200 }), (s) => {
        const joined = commentLines(s).join('\n');
        return /^[\x20-\x7e\n]*$/.test(joined) && !/\*\/|\/\*|\?\?|\\/.test(joined);
      }),
    );
  });
});
