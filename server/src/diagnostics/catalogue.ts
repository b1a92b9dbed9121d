// Every diagnostic the engine can report: a stable code, its severity and its documentation.
// Code actions, the CLI exit status and SARIF rule ids key on `code`, never on message text.

import { blockKinds } from '../model/schema';

export type Severity = 'error' | 'warning' | 'info';

export interface CodeInfo {
  severity: Severity;
  title: string;
  /** What the check means and why; shown in hovers, SARIF rule help and docs/reference.md. */
  doc: string;
}

export const CATALOGUE = {
  'syntax': { severity: 'error', title: 'Syntax error', doc: 'A line could not be read. The message says what was expected at the marked place.' },
  // The block kinds come from the schema on first read (the sensor kinds' registry is read lazily).
  'unknown-block': { severity: 'error', title: 'Unknown block kind', get doc() { return `A block starts with a kind the language does not define (it defines ${blockKinds().join(', ')}).`; } },
  'unknown-field': { severity: 'error', title: 'Unknown field', doc: 'The block kind has no field of this name.' },
  'duplicate-field': { severity: 'error', title: 'Field given twice', doc: 'A field may appear once per block; the second one is ignored.' },
  'duplicate-name': { severity: 'error', title: 'Name defined twice', doc: 'Two definitions share a name (in this file or in a file it uses).' },
  'unknown-name': { severity: 'error', title: 'Unknown name', doc: 'A channel refers to a device or ADC that is not defined here or in a used file.' },
  'wrong-kind': { severity: 'error', title: 'Name of the wrong kind', doc: 'A name refers to a definition of another kind (an ADC where a sensor is expected).' },
  'missing-field': { severity: 'error', title: 'Required field missing', doc: 'A field without a sound default is missing.' },
  'bad-value': { severity: 'error', title: 'Value not understood', doc: 'The value does not have the form the field takes.' },
  'wrong-unit': { severity: 'error', title: 'Wrong unit', doc: 'The unit is not of the dimension the field takes (a resistor given in volts).' },
  'out-of-domain': { severity: 'error', title: 'Value out of its domain', doc: 'The value is physically meaningless or outside what the engine supports (negative resistance, zero bits, below 0 K).' },
  'import-missing': { severity: 'error', title: 'Used file not found', doc: 'A `use` names a file that cannot be read.' },
  'import-cycle': { severity: 'error', title: 'Files use each other in a cycle', doc: 'A chain of `use` lines leads back to a file already being read.' },
  'import-outside-root': { severity: 'error', title: 'Used file outside the workspace', doc: 'A `use` path leaves the workspace root (for the CLI, the folder given with --root, by default the file\'s own folder) and is refused.' },
  'more-problems': { severity: 'info', title: 'More problems than are listed', doc: 'A file has more than 200 diagnostics: the first 200 (by position) are listed and this one stands for the rest, from the first one left off, as severe as the worst of them. A file that broken needs its first problems fixed before the rest mean much; the cap also keeps a huge broken file from stalling the tool.' },
  'import-problems': { severity: 'error', title: 'Used file has errors', doc: 'A file brought in with `use` has errors of its own; they are listed against that file.' },
  'bias-current-low': { severity: 'warning', title: 'Bias current below the range that works well', doc: 'Below the window (default 1 µA) reverse leakage, surface currents and ADC input leakage become a visible share of the bias and noise pickup grows (common practice).' },
  'bias-current-high': { severity: 'warning', title: 'Bias current above the range that works well', doc: 'Above the window (default 1 mA) self-heating of a small-signal part and the drop on its series resistance become visible errors (common practice).' },
  'clip-high': { severity: 'error', title: 'Sensed voltage above the ADC reference', doc: 'Somewhere in the range the sensed voltage exceeds the reference: the ADC saturates at full scale.' },
  'clip-low': { severity: 'error', title: 'Sensed voltage below zero', doc: 'Somewhere in the range the sensed voltage is below 0 V: the ADC reads zero.' },
  'code-saturated': { severity: 'warning', title: 'Range reaches an end code of the converter', doc: 'The sensed voltage stays within 0 V .. the reference, but part of the range gives code 0 (below 1 LSB) or the full-scale code 2^bits - 1 (at or above (2^bits - 1) LSB). Each end code stands for every voltage beyond it, so the temperatures there read alike; the generated code reports an end code as outside the range, never as a temperature. The message gives the temperatures that share the code.' },
  'fault-in-range': { severity: 'warning', title: 'Sensor fault reads as a temperature', doc: 'An open or shorted sensor (or lead) gives an ADC code inside the range the channel converts, so the firmware cannot tell the fault from a temperature and would act on a false reading. The fault codes follow from the circuit: an open junction or RTD on a resistor goes to the supply, on a current source to its compliance (taken as full scale); an open thermistor in a divider goes to the divider\'s supply or ground side; a short goes to 0 Ω with uncompensated leads still in series. Move the range or the bias so the fault codes fall outside it.' },
  'clip-tolerance': { severity: 'warning', title: 'Clips at the low end of the reference tolerance', doc: 'With the reference at the low end of its tolerance the sensed voltage exceeds it.' },
  'resolution-short': { severity: 'warning', title: 'Resolution worse than required', doc: 'At the worst point of the range one ADC count spans more temperature than the resolution target allows.' },
  'self-heating': { severity: 'warning', title: 'Self-heating eats the accuracy budget', doc: 'The power dissipated in the sensor times its thermal resistance exceeds a share (default 10 %) of the accuracy target.' },
  'nonlinearity': { severity: 'warning', title: 'Straight-line conversion misses the accuracy target', doc: 'With `conversion = line`, the deviation of the best-fit straight line from the sensor over the range exceeds the accuracy target.' },
  'outside-rated': { severity: 'warning', title: 'Range outside the part\'s rated junction range', doc: 'The channel range reaches beyond the junction temperatures the part is rated for.' },
  'supply-too-low': { severity: 'error', title: 'Supply too low to forward-bias the junction', doc: 'Even with the resistor shorted the supply cannot push the minimum sound current through the junction at the cold end.' },
  'source-impedance': { severity: 'warning', title: 'Source impedance above the ADC maximum', doc: 'The sensor node\'s source impedance exceeds the maximum the ADC states: the sample capacitor will not settle. Add a capacitor at the ADC input or a buffer.' },
  'accuracy-unmet': { severity: 'warning', title: 'Error budget misses the accuracy target', doc: 'With every stated tolerance at its worst (corner analysis) and after the stated calibration, the temperature the firmware reports is off by more than the accuracy target somewhere in the range. The message names the dominant contributor and a calibration that would meet the target, if one does.' },
  'calibration-outlier': { severity: 'warning', title: 'Measured calibration point disagrees with the others', doc: 'Fitted to the other measured points, the model misses this one by more than the tolerance (half the accuracy target, at least 2 LSB), or two points read at one temperature differ by more than that: check the reference thermometer, the settling time and the code read at that point. A flagged point is left out of the fit that generated code and the error budget use.' },
  'measured-unused': { severity: 'warning', title: 'Measured points not used for this sensor kind', doc: 'The fit to measured points covers junction channels only; on a thermistor or RTD channel the points would otherwise be ignored without a word, so the error budget and the generated code would not reflect them.' },
  'two-current-unresolved': { severity: 'warning', title: 'ADC cannot resolve the two-current difference', doc: 'The difference voltage of the two-current method changes by only about N*k/q*ln(I2/I1) (some 0.2 mV/K for a ratio of 10): one ADC count spans more temperature than the resolution target (or 0.5 K when none is given). The message gives the amplifier gain or oversampling that would meet it.' },
  'oversampling-noise': { severity: 'warning', title: 'Too little noise for oversampling to add bits', doc: 'Oversampling and decimation add resolution only when the noise at the input toggles the LSB: at least 0.5 LSB rms (Atmel application note AVR121). With less stated noise, or none stated, the extra bits are not credited; add dither or drop the oversampling.' },
  'generated-stale': { severity: 'warning', title: 'Generated conversion code is out of date', doc: 'The `<spec>_conversion.c` beside the spec holds a generated block for this channel made from different channel inputs (its marker carries a hash of them): the firmware converts with an older design. Regenerate it (code action or `thermoscribe gen`). Checked by the language server and by `thermoscribe check`, which read the C file beside the spec (or the one named with `--code`).' },
  'generated-orphan': { severity: 'warning', title: 'Generated block of a channel the spec no longer has', doc: 'A conversion file beside the spec (or named with `check --code`) holds a generated block for a channel this spec does not define: it was removed or renamed, and the old function still compiles and links. Delete the block (`thermoscribe gen --prune`) or restore the channel. Do not prune a file that several specs share.' },
  'divider-off-optimum': { severity: 'warning', title: 'Thermistor divider resistor far from its best value', doc: 'The slope of a divider at temperature T is largest when the fixed resistor equals the thermistor\'s resistance at T (maximise Rf/(Rf + Rt)^2 over Rf). At the centre of the range the stated resistor gives less than 80 % of that slope; the message suggests the E24 value nearest the optimum and the resolution it gives. A lower resistor also raises the current: check self-heating.' },
  'beta-extrapolated': { severity: 'info', title: 'Beta model used far outside its temperature pair', doc: 'A thermistor given by beta is modelled exactly at 25 °C and for the two temperatures its beta was specified between; real curves bend away from the beta model outside them. The note appears when the range reaches more than 10 K beyond that pair: give Steinhart-Hart coefficients or three measured points instead.' },
  'lead-resistance': { severity: 'warning', title: 'Two-wire RTD leads read as temperature', doc: 'With two wires both leads are in series with the element. The conversion subtracts the stated lead resistance, but a change of it (cable length, the leads warming) reads 1:1 as temperature; when a 10 % change exceeds 10 % of the accuracy target (0.1 K without one), use three wires (matched leads cancel) or four.' },
  'class-validity': { severity: 'info', title: 'Range outside the RTD class\'s range of validity', doc: 'IEC 60751 specifies each tolerance class over a temperature range, narrower for film elements than for wire-wound ones (AA: film 0 .. 150 °C, wire-wound -50 .. 250 °C; A: -30 .. 300 °C, -100 .. 450 °C; B: -50 .. 500 °C, -196 .. 600 °C; C: -50 .. 600 °C, -196 .. 600 °C; from memory). Outside it the class tolerance is not guaranteed and the error budget\'s element spread, taken from the class, is optimistic. The note appears when the channel range leaves the film range and says whether it also leaves the wire-wound one.' },
} satisfies Record<string, CodeInfo>;

export type DiagnosticCode = keyof typeof CATALOGUE;

export function codeInfo(code: DiagnosticCode): CodeInfo {
  return CATALOGUE[code];
}
