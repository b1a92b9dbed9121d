// Generates a large invented spec for benchmarks: `channels` channels, each with its own junction
// and ADC definitions (about 30 lines per channel, so 200 channels give about 6,000 lines).
// `variant` changes every channel's BF, so that no cache built for one variant serves another.
export function generateSpec(channels: number, variant = 0): string {
  const out: string[] = ['# Invented benchmark spec: many channels of a made-up test rig.', ''];
  for (let i = 0; i < channels; i++) {
    const is = (5 + (i % 10)).toString();
    out.push(
      `# ---- channel group ${i} ----------------------------------------------`,
      `junction part_${i} {`,
      `  kind     = ${i % 3 === 2 ? 'diode' : 'npn'}`,
      `  IS       = ${is} fA ± 30 %`,
      `  N        = ${i % 3 === 2 ? '1.05' : '1.0'}`,
      `  BF       = ${150 + ((i + variant) % 100)}`,
      `  EG       = 1.11 eV`,
      `  XTI      = 3`,
      `  TNOM     = 27 °C`,
      `  RS       = ${1 + (i % 5)} ohm`,
      `  rated    = -55 °C .. 150 °C`,
      `  theta_ja = 400 K/W`,
      `}`,
      '',
      `adc conv_${i} {`,
      `  bits       = ${10 + (i % 3) * 2}`,
      `  reference  = ${i % 2 ? '1.2 V ± 0.5 %' : '2.048 V ± 0.1 %'}`,
      `  max_source = 50 kohm`,
      `}`,
      '',
      `channel probe_${i} {`,
      `  sensor     = part_${i}`,
      `  adc        = conv_${i}`,
      `  bias       = ${i % 2 ? `resistor ${100 + (i % 7) * 20}k ± 1 % from 3.3 V ± 2 %` : `current ${10 + (i % 9) * 5} uA ± 1 %`}`,
      `  range      = -40 °C .. 125 °C`,
      `  resolution = 0.5 °C per count`,
      `  accuracy   = ± 1 °C`,
      `}`,
      '',
      '',
    );
  }
  return out.join('\n');
}
