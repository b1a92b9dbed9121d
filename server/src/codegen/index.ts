// Public surface of the code generator (pure: no file IO, no editor APIs).
export { generateC } from './generate';
export { spliceGenerated, findGeneratedBlocks, scanGeneratedBlocks } from './markers';
export { CodegenInputError } from '../sensors/conversion';
