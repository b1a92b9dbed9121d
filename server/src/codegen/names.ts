// C identifiers and comment text derived from user-written spec text.
// Everything here must keep a hostile name or note from escaping a C comment, string or identifier.

const C_KEYWORDS = new Set([
  // C99 keywords (ISO/IEC 9899:1999, 6.4.1) plus later ones a newer compiler may reserve.
  'auto', 'break', 'case', 'char', 'const', 'continue', 'default', 'do', 'double', 'else', 'enum',
  'extern', 'float', 'for', 'goto', 'if', 'inline', 'int', 'long', 'register', 'restrict', 'return',
  'short', 'signed', 'sizeof', 'static', 'struct', 'switch', 'typedef', 'union', 'unsigned', 'void',
  'volatile', 'while', 'bool', 'true', 'false', 'alignas', 'alignof', 'static_assert', 'thread_local',
  'nullptr', 'constexpr', 'typeof', 'asm', 'main',
]);

const MAX_IDENT = 32;

/** Identifier stem from a channel name: ASCII lowercase letters, digits and single underscores. */
export function identifierStem(name: string): string {
  // NFKD splits accented letters into base letter + combining mark; the marks are then dropped.
  const ascii = name.normalize('NFKD').replace(/[\u0300-\u036f]/g, '');
  let s = ascii.toLowerCase().replace(/[^a-z0-9]+/g, '_').replace(/^_+|_+$/g, '');
  if (s.length === 0) s = 'channel';
  if (/^[0-9]/.test(s)) s = `ch_${s}`;
  if (s.length > MAX_IDENT) s = s.slice(0, MAX_IDENT).replace(/_+$/, '');
  if (C_KEYWORDS.has(s)) s = `${s}_ch`;
  return s;
}

/** Unique identifiers for a list of channel names, in order; clashes get _2, _3, ... */
export function uniqueIdentifiers(names: readonly string[]): string[] {
  const used = new Set<string>();
  return names.map((n) => {
    const stem = identifierStem(n);
    let id = stem;
    for (let k = 2; used.has(id); k++) id = `${stem}_${k}`;
    used.add(id);
    return id;
  });
}

/**
 * Text safe inside a C block comment, one physical line each: printable ASCII only, no comment
 * delimiters, no trigraphs (C99 5.2.1.1: "??/" would become a backslash), no line splices.
 * Every one-character mapping runs first and the pair-breaking last: breaking inserts only spaces,
 * which no delimiter contains, so no later step can join two characters into a delimiter again
 * (a backslash mapped to '/' after the breaking once let `*\` become `*` + `/`).
 */
export function commentLines(text: string, maxLines = 12, maxWidth = 96): string[] {
  const out: string[] = [];
  for (const raw of text.split(/\r\n|\r|\n|\u2028|\u2029/)) {
    let s = raw
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .replace(/\t/g, ' ')
      .replace(/[^\x20-\x7e]/g, '?')
      .replace(/\\/g, '/');
    for (let prev = ''; prev !== s; ) {
      prev = s;
      s = s.replace(/\*\//g, '* /').replace(/\/\*/g, '/ *').replace(/\?\?/g, '? ?').replace(/\/\//g, '/ /');
    }
    s = s.trimEnd();
    while (s.length > maxWidth) {
      // A cut never splits a delimiter in a way that matters: each physical line sits after ' * '.
      out.push(s.slice(0, maxWidth));
      s = s.slice(maxWidth);
    }
    out.push(s);
    if (out.length >= maxLines) break;
  }
  return out.slice(0, maxLines);
}

/** Channel name for a marker: reversible percent-encoding of anything but [A-Za-z0-9_.-]. */
export function encodeMarkerField(s: string): string {
  let out = '';
  for (const ch of s) {
    if (/^[A-Za-z0-9_.-]$/.test(ch)) out += ch;
    else for (const b of new TextEncoder().encode(ch)) out += `%${b.toString(16).toUpperCase().padStart(2, '0')}`;
  }
  return out.length ? out : '%';
}

export function decodeMarkerField(s: string): string | undefined {
  if (s === '%') return '';
  try {
    return decodeURIComponent(s);
  } catch {
    return undefined;
  }
}
