// class-validity with the rtd's `element` field: a wire-wound element is judged on the wider
// wire-wound range of IEC 60751 (class AA: -50 .. 250 °C wire-wound, 0 .. 150 °C film; from memory).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';

const FIRES = fs.readFileSync(path.resolve(__dirname, '../../fixtures/diagnostics/class-validity.fires.tsense'), 'utf8');
const codes = (text: string) => analyse({ path: '/v/c.tsense', text }).diagnostics.map((d) => d.code);

describe('class-validity and element construction', () => {
  it('fires for a film element (stated or assumed) at 20 .. 200 °C, class AA', () => {
    expect(codes(FIRES)).toContain('class-validity');
    expect(codes(FIRES.replace('class = AA', 'class = AA\n  element = film'))).toContain('class-validity');
  });
  it('stays quiet for a wire-wound element inside -50 .. 250 °C', () => {
    expect(codes(FIRES.replace('class = AA', 'class = AA\n  element = wire'))).not.toContain('class-validity');
  });
  it('fires for a wire-wound element beyond 250 °C', () => {
    const text = FIRES.replace('class = AA', 'class = AA\n  element = wire').replace('20 °C .. 200 °C', '20 °C .. 300 °C');
    expect(codes(text)).toContain('class-validity');
  });
});
