// SARIF 2.1.0 output (OASIS Static Analysis Results Interchange Format, Version 2.1.0, 2020):
// one run, rules from the diagnostic catalogue, results with 1-based line/column regions
// (SARIF's default column unit is UTF-16 code units, as our offsets are).
import { pathToFileURL } from 'node:url';
import { CATALOGUE, type DiagnosticCode } from '../diagnostics/catalogue';
import type { Diagnostic } from '../diagnostics/diagnostic';
import { LineIndex } from '../syntax/line-index';

const LEVEL = { error: 'error', warning: 'warning', info: 'note' } as const;

export function sarifLog(diagnostics: Diagnostic[], indexOf: (file: string) => LineIndex, version: string) {
  const codes = Object.keys(CATALOGUE) as DiagnosticCode[];
  return {
    version: '2.1.0',
    runs: [
      {
        tool: {
          driver: {
            name: 'thermoscribe',
            version,
            rules: codes.map((code) => ({
              id: code,
              name: code.replace(/(^|-)([a-z])/g, (_m, _d, c: string) => c.toUpperCase()),
              shortDescription: { text: CATALOGUE[code].title },
              fullDescription: { text: CATALOGUE[code].doc },
              defaultConfiguration: { level: LEVEL[CATALOGUE[code].severity] },
            })),
          },
        },
        results: diagnostics.map((d) => {
          const idx = indexOf(d.file);
          const s = idx.position(d.span.start);
          const e = idx.position(d.span.end);
          return {
            ruleId: d.code,
            ruleIndex: codes.indexOf(d.code),
            level: LEVEL[d.severity],
            message: { text: d.message },
            locations: [
              {
                physicalLocation: {
                  artifactLocation: { uri: pathToFileURL(d.file).href },
                  region: { startLine: s.line + 1, startColumn: s.character + 1, endLine: e.line + 1, endColumn: e.character + 1 },
                },
              },
            ],
          };
        }),
      },
    ],
  };
}
