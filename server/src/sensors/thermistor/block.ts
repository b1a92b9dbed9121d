// The thermistor block of the language: its fields with forms, defaults, docs and examples.
import type { BlockSpec } from '../../model/schema';

export const block: BlockSpec = {
  kind: 'thermistor',
  doc: 'An NTC thermistor. Give its curve one way: `r25` and `beta` (the beta model), `sh_a`, `sh_b`, `sh_c` (Steinhart-Hart coefficients), or `point_1`..`point_3` (three measured points; the engine fits the Steinhart-Hart coefficients through them exactly).',
  template: ['r25', 'beta', 'dissipation'],
  fields: [
    { name: 'r25', form: { form: 'quantity', dimension: 'resistance', tolerance: true, min: 1, minInclusive: true, max: 1e8 }, doc: 'Resistance at 25 °C (R25), with its tolerance. Required with `beta`.', example: 'r25 = 10k ± 1 %', alternative: 'r25 and beta' },
    { name: 'beta', form: { form: 'quantity', dimension: 'temperature', difference: true, tolerance: true, min: 100, minInclusive: true, max: 20000 }, doc: 'Beta constant in kelvin, with its tolerance: R(T) = R25 exp(beta (1/T - 1/298.15 K)).', example: 'beta = 3950 K ± 1 %', alternative: 'r25 and beta' },
    { name: 'beta_range', form: { form: 'range', dimension: 'temperature' }, defaultText: '25 °C .. 85 °C', doc: 'The two temperatures beta is specified between on the datasheet (beta 25/85 by default). The beta model is exact at 25 °C and keeps the datasheet\'s resistance ratio between these two; outside them its error grows.', example: 'beta_range = 25 °C .. 50 °C' },
    { name: 'sh_a', form: { form: 'quantity', dimension: 'dimensionless', min: -1, minInclusive: true, max: 1 }, doc: 'Steinhart-Hart A (1/K): 1/T = A + B ln R + C (ln R)^3 with R in ohms.', example: 'sh_a = 1.129e-3', alternative: 'Steinhart-Hart coefficients' },
    { name: 'sh_b', form: { form: 'quantity', dimension: 'dimensionless', min: 0, max: 1 }, doc: 'Steinhart-Hart B (1/K).', example: 'sh_b = 2.341e-4', alternative: 'Steinhart-Hart coefficients' },
    { name: 'sh_c', form: { form: 'quantity', dimension: 'dimensionless', min: -1, minInclusive: true, max: 1 }, doc: 'Steinhart-Hart C (1/K).', example: 'sh_c = 8.775e-8', alternative: 'Steinhart-Hart coefficients' },
    { name: 'point_1', form: { form: 'phrase', syntax: 'T R' }, doc: 'A measured point, temperature then resistance; give three (point_1, point_2, point_3) and the engine fits the Steinhart-Hart coefficients through them exactly.', example: 'point_1 = 0 °C 32.65k', alternative: 'three points' },
    { name: 'point_2', form: { form: 'phrase', syntax: 'T R' }, doc: 'The second measured point (see point_1).', example: 'point_2 = 25 °C 10k', alternative: 'three points' },
    { name: 'point_3', form: { form: 'phrase', syntax: 'T R' }, doc: 'The third measured point (see point_1).', example: 'point_3 = 70 °C 1.752k', alternative: 'three points' },
    { name: 'r_tolerance', form: { form: 'phrase', syntax: '± x %' }, defaultText: '± 0 %', doc: 'Resistance tolerance of a curve given by coefficients or points (with `beta`, put it on `r25`).', example: 'r_tolerance = ± 1 %' },
    { name: 'dissipation', form: { form: 'phrase', syntax: 'x mW/K' }, defaultText: '1.5 mW/K', doc: 'Dissipation constant: the power that warms the thermistor 1 K above its surroundings. Self-heating = power / dissipation. The default is a typical figure for a small epoxy bead in still air (from memory); take yours from the datasheet.', example: 'dissipation = 1.5 mW/K' },
    { name: 'rated', form: { form: 'range', dimension: 'temperature' }, defaultText: '-40 °C .. 125 °C', doc: 'Temperature range the part is rated for.', example: 'rated = -40 °C .. 125 °C' },
  ],
};
