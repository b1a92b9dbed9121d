// Generated from server/src/model/schema.ts by `npm run docs` (scripts/gen-docs.ts). Do not edit.

/** Words that may start a top-level line: `use` and every block keyword. */
export const TOP_WORDS: readonly string[] = ['use', 'junction', 'thermistor', 'rtd', 'thermocouple', 'adc', 'channel'];
