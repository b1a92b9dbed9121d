// User text echoed inside a message (a name, a path, a number as written). Messages reach terminals
// and CI logs: a control character there can move the cursor, recolour or hide lines (ECMA-48
// escape sequences), and a bidirectional override can reorder what a reader sees (Unicode UAX #9).
// So every character of that kind is shown as an escape, and long text is cut in the middle.

/** C0 and C1 controls, DEL, line/paragraph separators and the bidirectional formatting characters. */
const UNSAFE = /[\u0000-\u001f\u007f-\u009f\u061c\u200e\u200f\u2028\u2029\u202a-\u202e\u2066-\u2069]/g;

/** Echoed user text longer than this many characters is shortened. */
export const SHOWN_MAX = 60;

function escapeOne(ch: string): string {
  const c = ch.charCodeAt(0);
  if (c === 9) return '\\t';
  if (c === 10) return '\\n';
  if (c === 13) return '\\r';
  return c < 0x100 ? `\\x${c.toString(16).padStart(2, '0')}` : `\\u${c.toString(16).padStart(4, '0')}`;
}

/** Every unsafe character as a visible escape (`\x1b`, `\u202e`); nothing else changes. */
export function escapeControls(text: string, keepNewlines = false): string {
  return text.replace(UNSAFE, (ch) => (keepNewlines && ch === '\n' ? ch : escapeOne(ch)));
}

/**
 * User text as a message shows it: unsafe characters escaped, and beyond `max` characters the
 * middle replaced by '…' with the full length given, so a 100,000-digit number stays one line.
 */
export function shown(text: string, max = SHOWN_MAX): string {
  if (text.length <= max) return escapeControls(text);
  const points = Array.from(text);
  if (points.length <= max) return escapeControls(text);
  const tail = Math.max(4, Math.floor(max / 4));
  const head = max - tail - 1;
  return `${escapeControls(points.slice(0, head).join(''))}…${escapeControls(points.slice(points.length - tail).join(''))} (${points.length} characters)`;
}
