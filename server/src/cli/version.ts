// Version reported by the CLI and in SARIF; kept equal to package.json by a unit test.
export const VERSION = '0.1.0';
