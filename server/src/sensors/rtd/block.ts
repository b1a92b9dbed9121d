// The rtd block of the language: its fields with forms, defaults, docs and examples.
import type { BlockSpec } from '../../model/schema';

export const block: BlockSpec = {
  kind: 'rtd',
  doc: 'A platinum resistance thermometer (Pt100, Pt1000, any R0) following the Callendar-Van Dusen equation of IEC 60751.',
  template: ['r0', 'class'],
  fields: [
    { name: 'r0', form: { form: 'quantity', dimension: 'resistance', tolerance: true, min: 1, minInclusive: true, max: 1e6 }, doc: 'Resistance at 0 °C: 100 for a Pt100, 1000 for a Pt1000, with an optional tolerance.', example: 'r0 = 1000' },
    { name: 'cvd_a', form: { form: 'quantity', dimension: 'dimensionless', min: -0.1, minInclusive: true, max: 0.1 }, defaultText: '3.9083e-3', doc: 'Callendar-Van Dusen A, 1/°C (IEC 60751 value by default).', example: 'cvd_a = 3.9083e-3' },
    { name: 'cvd_b', form: { form: 'quantity', dimension: 'dimensionless', min: -1e-3, minInclusive: true, max: 1e-3 }, defaultText: '-5.775e-7', doc: 'Callendar-Van Dusen B, 1/°C² (IEC 60751 value by default).', example: 'cvd_b = -5.775e-7' },
    { name: 'cvd_c', form: { form: 'quantity', dimension: 'dimensionless', min: -1e-6, minInclusive: true, max: 1e-6 }, defaultText: '-4.183e-12', doc: 'Callendar-Van Dusen C, 1/°C⁴, used below 0 °C (IEC 60751 value by default).', example: 'cvd_c = -4.183e-12' },
    { name: 'class', form: { form: 'choice', options: ['AA', 'A', 'B', 'C'] }, doc: 'Tolerance class of IEC 60751: AA ±(0.1 + 0.0017|t|) °C, A ±(0.15 + 0.002|t|), B ±(0.3 + 0.005|t|), C ±(0.6 + 0.01|t|). Reported as a figure; unstated when absent.', example: 'class = A', optional: true, optionDocs: { AA: 'IEC 60751 class AA: ±(0.1 + 0.0017|t|) °C.', A: 'IEC 60751 class A: ±(0.15 + 0.002|t|) °C.', B: 'IEC 60751 class B: ±(0.3 + 0.005|t|) °C.', C: 'IEC 60751 class C: ±(0.6 + 0.01|t|) °C.' } },
    { name: 'element', form: { form: 'choice', options: ['film', 'wire'] }, doc: 'How the element is built: `film` (thin film) or `wire` (wire-wound). IEC 60751 specifies each tolerance class over a wider range for wire-wound elements; when absent the narrower film range is assumed.', example: 'element = wire', optional: true },
    { name: 'dissipation', form: { form: 'phrase', syntax: 'x mW/K' }, defaultText: '2.5 mW/K', doc: 'Self-heating constant: the power that warms the element 1 K. The default is a typical thin-film element in still air (from memory); in a stirred liquid it is many times higher.', example: 'dissipation = 2.5 mW/K' },
    { name: 'rated', form: { form: 'range', dimension: 'temperature' }, defaultText: '-200 °C .. 850 °C', doc: 'Temperature range the element is rated for (default: the range of the IEC 60751 equation).', example: 'rated = -50 °C .. 500 °C' },
  ],
};
