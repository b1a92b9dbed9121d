// Offset <-> (line, character) conversion, both 0-based, characters in UTF-16 code units
// (the same units as peggy offsets and LSP positions). Lines end at \n, \r\n or \r.

export interface LineChar {
  line: number;
  character: number;
}

export class LineIndex {
  private readonly starts: number[] = [0];
  constructor(readonly text: string) {
    for (let i = 0; i < text.length; i++) {
      const ch = text.charCodeAt(i);
      if (ch === 13 /* \r */) {
        if (text.charCodeAt(i + 1) === 10) i++;
        this.starts.push(i + 1);
      } else if (ch === 10) this.starts.push(i + 1);
    }
  }
  get lineCount(): number {
    return this.starts.length;
  }
  position(offset: number): LineChar {
    const o = Math.max(0, Math.min(offset, this.text.length));
    let lo = 0;
    let hi = this.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.starts[mid]! <= o) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo, character: o - this.starts[lo]! };
  }
  offset(pos: LineChar): number {
    const line = Math.max(0, Math.min(pos.line, this.starts.length - 1));
    const start = this.starts[line]!;
    const next = line + 1 < this.starts.length ? this.starts[line + 1]! : this.text.length;
    return Math.min(start + Math.max(0, pos.character), next);
  }
}
