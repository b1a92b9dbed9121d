// Syntax tree of a .tsense file as the grammar builds it. Every node carries a span of
// UTF-16 offsets [start, end) into the text; conversion to lines happens at the edges.

export interface Span {
  start: number;
  end: number;
}

export interface Token {
  text: string;
  span: Span;
}

export interface NumberLit {
  /** Source text, e.g. "4k7". */
  text: string;
  /** Value before any unit prefix, e.g. 4700. */
  value: number;
  span: Span;
}

export interface QuantityTerm {
  kind: 'quantity';
  number: NumberLit;
  unit: Token | null;
  tolerance: QuantityTerm | null;
  span: Span;
}

export interface RangeTerm {
  kind: 'range';
  low: QuantityTerm;
  high: QuantityTerm;
  span: Span;
}

export interface ToleranceTerm {
  kind: 'tolerance';
  amount: QuantityTerm;
  span: Span;
}

export interface WordTerm {
  kind: 'word';
  text: string;
  span: Span;
}

export interface StringTerm {
  kind: 'string';
  text: string;
  span: Span;
}

export interface UnitTerm {
  kind: 'unit';
  text: string;
  span: Span;
}

export type Term = QuantityTerm | RangeTerm | ToleranceTerm | WordTerm | StringTerm | UnitTerm;

export interface FieldNode {
  kind: 'field';
  key: Token;
  value: Term[];
  span: Span;
}

export interface ErrorNode {
  kind: 'error';
  context: 'top' | 'field';
  text: string;
  span: Span;
}

export interface BlockNode {
  kind: 'block';
  keyword: Token;
  name: Token;
  fields: (FieldNode | ErrorNode)[];
  closed: boolean;
  closeSpan: Span | null;
  span: Span;
}

export interface UseNode {
  kind: 'use';
  path: StringTerm;
  span: Span;
}

export type TopItem = BlockNode | UseNode | ErrorNode;

export interface DocumentNode {
  kind: 'document';
  items: TopItem[];
  span: Span;
}

export interface SyntaxProblem {
  message: string;
  span: Span;
}

export interface ParseResult {
  tree: DocumentNode;
  problems: SyntaxProblem[];
}

/** One file's text and parse: all that the syntax-only features (folding, outline, semantic tokens) read. */
export interface SyntaxFile {
  text: string;
  parse: ParseResult;
}
