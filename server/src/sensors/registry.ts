// The sensor kinds, in the order completion, messages and documentation list them. A new kind is
// its folder under server/src/sensors/ plus one line here (DEVELOPERS.md, "How to add a sensor kind").
// Read lazily: kinds import modules that import this one, so nothing here runs at load time.
import type { SensorKind } from './kind';
import type { SensorDef } from '../model/types';
import { junction } from './junction';
import { thermistor } from './thermistor';
import { rtd } from './rtd';

let kinds: readonly SensorKind[] | undefined;
let byName: Map<string, SensorKind> | undefined;

export function sensorKinds(): readonly SensorKind[] {
  return (kinds ??= [
    junction,
    thermistor,
    rtd,
  ] as unknown as SensorKind[]);
}

/** The kind of a block keyword, or undefined when it is not a sensor kind. */
export function sensorKind(name: string): SensorKind | undefined {
  byName ??= new Map(sensorKinds().map((k) => [k.name, k]));
  return byName.get(name);
}

/** The kind of a definition (every sensor definition's kind is registered). */
export function kindOf(s: SensorDef): SensorKind {
  return sensorKind(s.kind)!;
}

/** "a junction, thermistor or rtd": the kinds for messages (the first with its article). */
export function kindsInWords(list: readonly SensorKind[] = sensorKinds(), joiner = 'or'): string {
  const words = list.map((k, i) => (i === 0 ? k.a : k.name));
  return words.length < 2 ? words.join('') : `${words.slice(0, -1).join(', ')} ${joiner} ${words[words.length - 1]}`;
}
