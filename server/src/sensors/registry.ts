// The sensor kinds, in the order completion, messages and documentation list them. The list itself
// is `sensors/kinds.ts` (a new kind is its folder plus one line there); it hands the kinds to
// `registerSensorKinds` when the engine's façade loads it. So the generic layers (model, analysis,
// budget, checks) dispatch through this file, which imports no kind: imports stay one-way
// (DEVELOPERS.md, "Layers").
import type { SensorKind } from './kind';
import type { SensorDef } from '../model/types';

let kinds: readonly SensorKind[] = [];
let byName = new Map<string, SensorKind>();

/** Called once by sensors/kinds.ts with every kind, in their listing order. */
export function registerSensorKinds(list: readonly SensorKind[]): void {
  kinds = list;
  byName = new Map(list.map((k) => [k.name, k]));
}

export function sensorKinds(): readonly SensorKind[] {
  if (kinds.length === 0) throw new Error('no sensor kind is registered: import server/src/sensors/kinds.ts (the engine façade does) before using the engine');
  return kinds;
}

/** The kind of a block keyword, or undefined when it is not a sensor kind. */
export function sensorKind(name: string): SensorKind | undefined {
  if (kinds.length === 0) sensorKinds();
  return byName.get(name);
}

/** The kind of a definition (every sensor definition's kind is registered). */
export function kindOf(s: SensorDef): SensorKind {
  return sensorKind(s.kind)!;
}

/**
 * The kinds that alone take a channel field (their `channelFields`: gain, offset, wiring, a
 * thermocouple's cold_junction, ...); empty for a field every channel takes. One rule for the
 * reader, which refuses the field on a channel of another kind, and for completion, which does not
 * offer it there.
 */
export function kindsTakingOnly(field: string): readonly SensorKind[] {
  return sensorKinds().filter((k) => k.channelFields.includes(field));
}

/** Whether a channel of kind `k` takes the channel field (see kindsTakingOnly). */
export function kindTakes(k: SensorKind, field: string): boolean {
  return k.channelFields.includes(field) || kindsTakingOnly(field).length === 0;
}

/** "a junction, thermistor or rtd": the kinds for messages (the first with its article). */
export function kindsInWords(list: readonly SensorKind[] = sensorKinds(), joiner = 'or'): string {
  const words = list.map((k, i) => (i === 0 ? k.a : k.name));
  return words.length < 2 ? words.join('') : `${words.slice(0, -1).join(', ')} ${joiner} ${words[words.length - 1]}`;
}
