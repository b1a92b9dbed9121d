// What may go before every identifier generated for a channel (the channel's `code_prefix`, the CLI's
// `gen --prefix`): one rule, read by the resolver and by the code generator.

/** Why `prefix` cannot start a generated identifier, or undefined when it can ('' is no prefix). */
export function prefixProblem(prefix: string): string | undefined {
  // A leading underscore is reserved to the implementation in many cases (C99 7.1.3).
  return prefix === '' || /^[A-Za-z][A-Za-z0-9_]{0,31}$/.test(prefix)
    ? undefined
    : `must be a C identifier of 1 to 32 letters, digits and underscores starting with a letter (got '${prefix.replace(/[^\x20-\x7e]/g, '?')}')`;
}
