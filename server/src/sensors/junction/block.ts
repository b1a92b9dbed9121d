// The junction block of the language: its fields with forms, defaults, docs and examples.
import type { BlockSpec } from '../../model/schema';

export const block: BlockSpec = {
  kind: 'junction',
  doc: 'A junction sensor: a diode-connected transistor or a signal diode, described by SPICE model parameters.',
  template: ['kind', 'IS', 'N', 'BF'],
  fields: [
    { name: 'kind', form: { form: 'choice', options: ['npn', 'pnp', 'diode'] }, defaultText: 'npn', doc: 'npn or pnp for a diode-connected transistor (base tied to collector; the terminal current includes the base current), diode for a plain junction diode.', example: 'kind = npn', optionDocs: { npn: 'Diode-connected NPN transistor (base tied to collector).', pnp: 'Diode-connected PNP transistor (base tied to collector).', diode: 'A plain junction diode.' } },
    { name: 'IS', form: { form: 'quantity', dimension: 'current', tolerance: true, min: 1e-24, minInclusive: true, max: 1e-3 }, doc: 'Saturation current at TNOM (SPICE IS).', example: 'IS = 10 fA' },
    { name: 'N', aliases: ['NF'], form: { form: 'quantity', dimension: 'dimensionless', min: 0.5, minInclusive: true, max: 4, tolerance: true }, defaultText: '1', doc: 'Emission coefficient (SPICE N for a diode, NF for a transistor), with an optional part-to-part spread (`N = 1.004 ± 0.2 %`).', example: 'N = 1.0' },
    { name: 'BF', form: { form: 'quantity', dimension: 'dimensionless', tolerance: true, min: 0.1, minInclusive: true, max: 1e5 }, defaultText: '100', doc: 'Forward current gain (SPICE BF), with an optional spread (`BF = 200 ± 50 %`); ignored for a plain diode.', example: 'BF = 200' },
    { name: 'EG', form: { form: 'quantity', dimension: 'energy', min: 0.1, minInclusive: true, max: 5 }, defaultText: '1.11 eV', doc: 'Activation energy (SPICE EG); 1.11 eV for silicon.', example: 'EG = 1.11 eV' },
    { name: 'XTI', form: { form: 'quantity', dimension: 'dimensionless', min: -10, minInclusive: true, max: 20 }, defaultText: '3', doc: 'Saturation-current temperature exponent (SPICE XTI).', example: 'XTI = 3' },
    { name: 'XTB', form: { form: 'quantity', dimension: 'dimensionless', min: -10, minInclusive: true, max: 10 }, defaultText: '0', doc: 'Temperature exponent of BF (SPICE XTB).', example: 'XTB = 1.5' },
    { name: 'TNOM', form: { form: 'quantity', dimension: 'temperature', min: 173.15, minInclusive: true, max: 473.15 }, defaultText: '27 °C', doc: 'Temperature at which the parameters were extracted (SPICE TNOM; SPICE\'s default is 27 °C).', example: 'TNOM = 27 °C' },
    { name: 'RS', form: { form: 'quantity', dimension: 'resistance', min: 0, minInclusive: true, max: 1e6 }, defaultText: '0 Ω', doc: 'Series resistance in the current path (diode RS; for a transistor fold RB/(1+BF) + RE in here).', example: 'RS = 1.5 ohm' },
    { name: 'rated', form: { form: 'range', dimension: 'temperature' }, defaultText: '-55 °C .. 150 °C', doc: 'Junction temperature range the part is rated for.', example: 'rated = -55 °C .. 150 °C' },
    { name: 'theta_ja', form: { form: 'quantity', dimension: 'thermal-resistance', min: 0, minInclusive: true, max: 1e5 }, defaultText: '500 K/W', doc: 'Junction-to-ambient thermal resistance for self-heating. The default is a conservative figure for a small SOT-23 part on minimal copper (from memory).', example: 'theta_ja = 350 K/W' },
  ],
};
