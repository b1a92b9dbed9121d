// Where scripts/e2e/install.sh puts the offline editor (versions pinned in scripts/e2e/versions.json).
import * as path from 'node:path';
import { existsSync, readFileSync } from 'node:fs';

export const ROOT = path.resolve(__dirname, '..', '..', '..');
const versions = JSON.parse(readFileSync(path.join(ROOT, 'scripts', 'e2e', 'versions.json'), 'utf8')) as {
  node: string; codeServer: string; chromium: string;
};

export const E2E_DIR = path.join(ROOT, '.e2e');
export const NODE_BIN = path.join(E2E_DIR, `node-${versions.node}`, 'bin');
export const CODE_SERVER_DIR = path.join(E2E_DIR, `code-server-${versions.codeServer}`);
export const CODE_SERVER = path.join(CODE_SERVER_DIR, 'bin', 'code-server');
export const CHROMIUM = versions.chromium;
export const OUTPUT_DIR = path.join(ROOT, '.test-output', 'e2e');

/** What is missing for an offline run, as messages; empty when everything is installed. */
export function missingPieces(): string[] {
  const missing: string[] = [];
  if (!existsSync(path.join(CODE_SERVER_DIR, '.complete')) || !existsSync(CODE_SERVER)) missing.push(`code-server ${versions.codeServer} (in ${CODE_SERVER_DIR})`);
  if (!existsSync(path.join(NODE_BIN, 'node'))) missing.push(`Node ${versions.node} (in ${NODE_BIN})`);
  if (!existsSync(CHROMIUM)) missing.push(`chromium (${CHROMIUM})`);
  if (!existsSync(path.join(ROOT, 'node_modules', 'playwright-core'))) missing.push('playwright-core (npm ci)');
  return missing;
}
