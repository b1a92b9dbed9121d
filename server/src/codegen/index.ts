// Public surface of the code generator (pure: no file IO, no editor APIs).
export { generateC, validateInput, type AnyConversionInput } from './generate';
export { simulateCompensated, type CompensatedInput } from './compensated';
export { spliceGenerated, findGeneratedBlocks, scanGeneratedBlocks, renderBlock } from './markers';
export { identifierStem, uniqueIdentifiers, commentLines } from './names';
export * from './types';
