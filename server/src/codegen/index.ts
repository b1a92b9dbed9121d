// Public surface of the code generator (pure: no file IO, no editor APIs).
export { generateC, validateInput } from './generate';
export { spliceGenerated, findGeneratedBlocks, scanGeneratedBlocks, renderBlock } from './markers';
export { identifierStem, uniqueIdentifiers, commentLines } from './names';
export * from './types';
