// Every sensor kind, one line each, in the order completion, messages and documentation list them.
// A new kind is its folder under server/src/sensors/ plus one line here (DEVELOPERS.md, "How to add
// a sensor kind"). Loaded by the engine's façade (and by the tests' setup and the docs script),
// which registers the kinds before anything reads them.
import type { SensorKind } from './kind';
import { registerSensorKinds } from './registry';
import { junction } from './junction';
import { thermistor } from './thermistor';
import { rtd } from './rtd';
import { thermocouple } from './thermocouple';

registerSensorKinds([
  junction,
  thermistor,
  rtd,
  thermocouple,
] as unknown as SensorKind[]);
