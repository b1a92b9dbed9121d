// A fast reader for the well-formed part of a spec, giving exactly the syntax tree that the
// peggy grammar (grammar/tsense.peggy) gives.
//
// Why: the generated parser builds an array for every repetition and sequence it matches (each
// letter of each name, each digit), so on a 6,000-line spec a third of its time is garbage
// collection. Most pieces of a spec are well-formed; this reader walks them once with char codes
// and builds only the tree. Each function below is one grammar rule, same order of alternatives,
// same backtracking. It reads no error lines: on the first line the grammar would turn into an
// error node (or a block left open) it gives up on the piece, and the caller parses that piece
// with the generated parser, which stays the one definition of the language and of its messages.
// Which letter runs are units is asked of the grammar itself (its UnitLit rule, memoised).
// tests/unit/engine/fast-reader.test.ts checks tree equality against the generated parser on the
// samples, the fixtures and mutated inputs.
import * as generated from './parser.generated.js';
import type { BlockNode, FieldNode, NumberLit, QuantityTerm, StringTerm, Term, Token, TopItem, UseNode } from './ast';

/**
 * The items the grammar's Document rule gives for text[start, end) (offsets stay those of
 * `text`), or null when that piece holds a line the grammar reads as an error or an unclosed block.
 */
export function readPieceFast(text: string, start: number, end: number): TopItem[] | null {
  return new Reader(text, start, end).document();
}

// Char codes.
const TAB = 9, LF = 10, CR = 13, SPACE = 32, QUOTE = 34, HASH = 35, PERCENT = 37, PLUS = 43, MINUS = 45;
const DOT = 46, SLASH = 47, SEMI = 59, EQUALS = 61, LBRACE = 123, RBRACE = 125, NBSP = 0xa0;
const PLUS_MINUS = 0xb1, DEGREE = 0xb0, CELSIUS_SIGN = 0x2103, FAHRENHEIT_SIGN = 0x2109;
const OMEGA = 0x3a9, MICRO = 0xb5, MU = 0x3bc;

/** IEC 60062 decimal-marker letters, as in the grammar's IEC_MULTIPLIER. */
const IEC_MULTIPLIER: Record<string, number> = { R: 1, r: 1, k: 1e3, K: 1e3, M: 1e6, G: 1e9 };

const isDigit = (c: number) => c >= 48 && c <= 57;
const isLetter = (c: number) => (c >= 65 && c <= 90) || (c >= 97 && c <= 122);
/** Word = [A-Za-z_] [A-Za-z0-9_]*; IdentChar = [A-Za-z0-9_]. */
const isWordStart = (c: number) => isLetter(c) || c === 95;
const isIdentChar = (c: number) => isWordStart(c) || isDigit(c);
/** UnitLetters = [a-zA-ZΩµμ]+ */
const isUnitLetter = (c: number) => isLetter(c) || c === OMEGA || c === MICRO || c === MU;
/** _ = [ \t\u00a0]* */
const isSpace = (c: number) => c === SPACE || c === TAB || c === NBSP;
/** [RrkKMG] */
const isIecLetter = (c: number) => c === 82 || c === 114 || c === 107 || c === 75 || c === 77 || c === 71;

/** Letter runs the grammar's UnitLit rule accepts, memoised (a spec uses a handful of units). */
const unitMemo = new Map<string, boolean>();

function isUnitText(text: string): boolean {
  let known = unitMemo.get(text);
  if (known === undefined) {
    try {
      generated.parse(text, { startRule: 'UnitLit' });
      known = true;
    } catch {
      known = false;
    }
    if (unitMemo.size > 4096) unitMemo.clear(); // random input must not grow it without bound
    unitMemo.set(text, known);
  }
  return known;
}

/**
 * One string object per distinct short text (names, units, numbers repeat all over a spec): a
 * tree keeps thousands of them, and each kept object is copied by every young-generation
 * collection that finds it alive. The substring made for the lookup is short-lived garbage.
 */
const interned = new Map<string, string>();

function intern(text: string): string {
  if (text.length > 24) return text;
  const known = interned.get(text);
  if (known !== undefined) return known;
  if (interned.size > 8192) interned.clear(); // random input must not grow it without bound
  interned.set(text, text);
  return text;
}

class Reader {
  private p: number;
  /** Set when the piece holds an error line or an unclosed block: the caller uses peggy. */
  private bad = false;

  constructor(private readonly t: string, start: number, private readonly e: number) {
    this.p = start;
  }

  /** Char code at i, or -1 at the end of the piece (peggy's end of input). */
  private c(i: number): number {
    return i < this.e ? this.t.charCodeAt(i) : -1;
  }

  // ------------------------------------------------------------ top level

  /** Document = TopEntry* Blank* _ Comment? EndOfInput */
  document(): TopItem[] | null {
    const items: TopItem[] = [];
    for (;;) {
      // TopEntry = Blank* _ !(Comment? EndOfInput) (Use / Block / BadTop)
      while (this.blank());
      this.ws();
      const beforeComment = this.p;
      this.comment();
      if (this.p >= this.e) return items; // Document's tail: Blank* _ Comment? EndOfInput
      this.p = beforeComment;
      const item = this.use() ?? this.block();
      if (this.bad || item === null) return null; // BadTop: an error line
      items.push(item);
    }
  }

  /** Use = UseStatement LineEnd;  UseStatement = "use" !IdentChar _ StringLit */
  private use(): UseNode | null {
    const s = this.p;
    if (!(this.c(s) === 117 && this.c(s + 1) === 115 && this.c(s + 2) === 101 && !isIdentChar(this.c(s + 3)))) return null;
    this.p = s + 3;
    this.ws();
    const path = this.stringLit();
    if (path === null) {
      this.p = s;
      return null;
    }
    const node: UseNode = { kind: 'use', path, span: { start: s, end: this.p } };
    // LineEnd = _ Comment? (Newline / EndOfInput)
    this.ws();
    this.comment();
    if (this.newline() || this.p >= this.e) return node;
    this.p = s;
    return null;
  }

  /** Block = BlockHeader _ Comment? BlockLine* BlockClose */
  private block(): BlockNode | null {
    const s = this.p;
    // BlockHeader = Word _ Word _ "{"
    const keyword = this.word();
    if (keyword === null) return null;
    this.ws();
    const name = this.word();
    if (name === null || (this.ws(), this.c(this.p) !== LBRACE)) {
      this.p = s;
      return null;
    }
    this.p++;
    this.ws();
    this.comment();
    const fields: FieldNode[] = [];
    for (;;) {
      // BlockLine = _ FieldWithEnd / Blank+ / _ !"}" !BlockHeader BadField
      const line = this.p;
      this.ws();
      const f = this.fieldWithEnd();
      if (f !== null) {
        fields.push(f);
        continue;
      }
      this.p = line;
      if (this.blank()) continue;
      break;
    }
    // BlockClose = Blank* _ "}". Anything else here is a bad field line or an unclosed block.
    this.ws();
    if (this.c(this.p) !== RBRACE) {
      this.bad = true;
      return null;
    }
    this.p++;
    const closeSpan = { start: this.p - 1, end: this.p };
    return { kind: 'block', keyword, name, fields, closed: true, closeSpan, span: { start: s, end: this.p } };
  }

  // ------------------------------------------------------------ fields

  /** FieldWithEnd = Field _ (";" _)? Comment? (Newline / &"}" / EndOfInput) */
  private fieldWithEnd(): FieldNode | null {
    const s = this.p;
    const f = this.field();
    if (f === null) return null;
    this.ws();
    if (this.c(this.p) === SEMI) {
      this.p++;
      this.ws();
    }
    this.comment();
    if (this.newline() || this.c(this.p) === RBRACE || this.p >= this.e) return f;
    this.p = s;
    return null;
  }

  /** Field = Word _ "=" _ Value */
  private field(): FieldNode | null {
    const s = this.p;
    const key = this.word();
    if (key === null) return null;
    this.ws();
    if (this.c(this.p) !== EQUALS) {
      this.p = s;
      return null;
    }
    this.p++;
    this.ws();
    const value = this.value();
    if (value === null) {
      this.p = s;
      return null;
    }
    return { kind: 'field', key, value, span: { start: s, end: this.p } };
  }

  /** Value = Term (_ Term)* */
  private value(): Term[] | null {
    const first = this.term();
    if (first === null) return null;
    const terms = [first];
    for (;;) {
      const s = this.p;
      this.ws();
      const next = this.term();
      if (next === null) {
        this.p = s;
        return terms;
      }
      terms.push(next);
    }
  }

  /** Term = Tolerance / QuantityOrRange / StringLit / WordTerm / BareUnit */
  private term(): Term | null {
    const s = this.p;
    // Tolerance = ToleranceSuffix
    const amount = this.toleranceSuffix();
    if (amount !== null) return { kind: 'tolerance', amount, span: { start: s, end: this.p } };
    // QuantityOrRange = Quantity QuantityTail?
    const q = this.quantity();
    if (q !== null) {
      const after = this.p;
      // QuantityTail = _ ".." _ RangeEnd / _ ToleranceSuffix
      this.ws();
      if (this.c(this.p) === DOT && this.c(this.p + 1) === DOT) {
        this.p += 2;
        this.ws();
        const high = this.quantity();
        if (high !== null) return { kind: 'range', low: q, high, span: { start: s, end: this.p } };
      }
      this.p = after;
      this.ws();
      const tolerance = this.toleranceSuffix();
      if (tolerance !== null) return { kind: 'quantity', number: q.number, unit: q.unit, tolerance, span: { start: s, end: this.p } };
      this.p = after;
      return q;
    }
    const str = this.stringLit();
    if (str !== null) return str;
    const w = this.word();
    if (w !== null) return { kind: 'word', text: w.text, span: w.span };
    const u = this.unitLit();
    if (u !== null) return { kind: 'unit', text: u.text, span: u.span };
    return null;
  }

  /** ToleranceSuffix = PlusMinus _ Quantity;  PlusMinus = "±" / "+/-" / "+-" */
  private toleranceSuffix(): QuantityTerm | null {
    const s = this.p;
    const c = this.c(s);
    if (c === PLUS_MINUS) this.p = s + 1;
    else if (c === PLUS && this.c(s + 1) === SLASH && this.c(s + 2) === MINUS) this.p = s + 3;
    else if (c === PLUS && this.c(s + 1) === MINUS) this.p = s + 2;
    else return null;
    this.ws();
    const q = this.quantity();
    if (q === null) this.p = s;
    return q;
  }

  /** Quantity = NumberLit (_ UnitLit)? */
  private quantity(): QuantityTerm | null {
    const s = this.p;
    const number = this.numberLit();
    if (number === null) return null;
    const after = this.p;
    this.ws();
    const unit = this.unitLit();
    if (unit === null) this.p = after;
    return { kind: 'quantity', number, unit, tolerance: null, span: { start: s, end: this.p } };
  }

  // ------------------------------------------------------------ lexical

  /**
   * NumberLit = $([+-]? Digits [RrkKMG] Digits) !IdentChar
   *           / $([+-]? (Digits ("." Digits)? / "." Digits) ([eE] [+-]? Digits)?)
   */
  private numberLit(): NumberLit | null {
    const s = this.p;
    let i = s;
    const sign = this.c(i);
    if (sign === PLUS || sign === MINUS) i++;
    const signEnd = i;
    // IEC 60062 form (4k7, 1R5): value computed as the grammar's action computes it.
    let j = this.digits(i);
    if (j > i && isIecLetter(this.c(j))) {
      const k = this.digits(j + 1);
      if (k > j + 1 && !isIdentChar(this.c(k))) {
        const t = this.t;
        const text = intern(t.substring(s, k));
        const value = (sign === MINUS ? -1 : 1) * Number(t.substring(signEnd, j) + '.' + t.substring(j + 1, k)) * IEC_MULTIPLIER[t[j]!]!;
        this.p = k;
        return { text, value, span: { start: s, end: k } };
      }
    }
    // Decimal form.
    if (j > i) {
      if (this.c(j) === DOT) {
        const k = this.digits(j + 1);
        if (k > j + 1) j = k;
      }
    } else if (this.c(i) === DOT && isDigit(this.c(i + 1))) {
      j = this.digits(i + 1);
    } else {
      return null;
    }
    const e = this.c(j);
    if (e === 101 || e === 69) {
      let k = j + 1;
      const es = this.c(k);
      if (es === PLUS || es === MINUS) k++;
      const m = this.digits(k);
      if (m > k) j = m;
    }
    const text = intern(this.t.substring(s, j));
    this.p = j;
    return { text, value: Number(text), span: { start: s, end: j } };
  }

  /** End of the digit run starting at i (i itself when there is none). */
  private digits(i: number): number {
    while (isDigit(this.c(i))) i++;
    return i;
  }

  /** UnitLit = $("%" / [°℃℉]? UnitLetters ("/" UnitLetters)?) !IdentChar &{ isUnitText } */
  private unitLit(): Token | null {
    const s = this.p;
    let i = s;
    if (this.c(i) === PERCENT) i++;
    else {
      const c = this.c(i);
      if (c === DEGREE || c === CELSIUS_SIGN || c === FAHRENHEIT_SIGN) i++;
      const letters = i;
      while (isUnitLetter(this.c(i))) i++;
      if (i === letters) return null;
      if (this.c(i) === SLASH && isUnitLetter(this.c(i + 1))) {
        i += 2;
        while (isUnitLetter(this.c(i))) i++;
      }
    }
    if (isIdentChar(this.c(i))) return null;
    const text = intern(this.t.substring(s, i));
    if (!isUnitText(text)) return null;
    this.p = i;
    return { text, span: { start: s, end: i } };
  }

  /** StringLit = "\"" [^"\n\r]* "\"" */
  private stringLit(): StringTerm | null {
    const s = this.p;
    if (this.c(s) !== QUOTE) return null;
    let i = s + 1;
    for (let c = this.c(i); c !== QUOTE; c = this.c(++i)) if (c === LF || c === CR || c === -1) return null;
    this.p = i + 1;
    return { kind: 'string', text: this.t.substring(s + 1, i), span: { start: s, end: i + 1 } };
  }

  /** Word = [A-Za-z_] [A-Za-z0-9_]* */
  private word(): Token | null {
    const s = this.p;
    if (!isWordStart(this.c(s))) return null;
    let i = s + 1;
    while (isIdentChar(this.c(i))) i++;
    this.p = i;
    return { text: intern(this.t.substring(s, i)), span: { start: s, end: i } };
  }

  /** Blank = _ Comment? Newline */
  private blank(): boolean {
    const s = this.p;
    this.ws();
    this.comment();
    if (this.newline()) return true;
    this.p = s;
    return false;
  }

  /** Comment = "#" [^\n\r]* */
  private comment(): void {
    if (this.c(this.p) !== HASH) return;
    let i = this.p + 1;
    for (let c = this.c(i); c !== LF && c !== CR && c !== -1; c = this.c(++i));
    this.p = i;
  }

  /** Newline = "\r\n" / "\n" / "\r" */
  private newline(): boolean {
    const c = this.c(this.p);
    if (c === CR) this.p += this.c(this.p + 1) === LF ? 2 : 1;
    else if (c === LF) this.p++;
    else return false;
    return true;
  }

  /** _ = [ \t\u00a0]* */
  private ws(): void {
    while (isSpace(this.c(this.p))) this.p++;
  }
}
