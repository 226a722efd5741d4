/** Streaming line splitter (JSON Lines and the like): callback per non-empty line with its 1-based number. */
export class LineSplitter {
  private carry = '';
  private line = 1;
  constructor(private readonly onLine: (text: string, line: number) => void) {}

  push(chunk: string): void {
    const buf = this.carry.length ? this.carry + chunk : chunk;
    let pos = 0;
    for (;;) {
      const nl = buf.indexOf('\n', pos);
      if (nl === -1) break;
      this.emit(buf, pos, nl);
      pos = nl + 1;
    }
    this.carry = buf.slice(pos);
  }

  end(): void {
    if (this.carry.length) this.emit(this.carry, 0, this.carry.length);
    this.carry = '';
  }

  private emit(buf: string, start: number, end: number): void {
    if (end > start && buf.charCodeAt(end - 1) === 13) end--;
    const text = buf.slice(start, end);
    if (text.trim().length) this.onLine(text, this.line);
    this.line++;
  }
}
