// Bundle entry of dist/cli.js.
import { run } from './main';
run();
