/**
 * Streams the objects of a JSON array (`[{...}, {...}]`) or of JSON Lines / concatenated
 * objects, one at a time, without holding the whole text: a small scanner tracks strings
 * and brace depth, and each complete object is handed to JSON.parse on its own.
 */
export class JsonObjectSplitter {
  private depth = 0; // brace/bracket depth
  private inString = false;
  private escape = false;
  private arrayDepth = -1; // depth of the outer array, when the text is an array
  private objStartDepth = -1;
  private parts: string[] = [];
  private line = 1;
  private objLine = 1;
  private stray = false;

  constructor(
    private readonly onObject: (text: string, line: number) => void,
    private readonly onStray: (line: number, what: string) => void,
  ) {}

  push(chunk: string): void {
    let segStart = -1;
    if (this.objStartDepth !== -1) segStart = 0;
    for (let i = 0; i < chunk.length; i++) {
      const c = chunk.charCodeAt(i);
      if (c === 10) this.line++;
      if (this.inString) {
        if (this.escape) this.escape = false;
        else if (c === 92) this.escape = true;
        else if (c === 34) this.inString = false;
        continue;
      }
      if (c === 34) {
        if (this.objStartDepth === -1) this.strayAt(`a string outside any object`);
        this.inString = true;
      } else if (c === 123 /* { */) {
        if (this.objStartDepth === -1 && (this.depth === 0 || this.depth === this.arrayDepth + 1)) {
          this.objStartDepth = this.depth;
          this.objLine = this.line;
          segStart = i;
          this.parts = [];
        }
        this.depth++;
      } else if (c === 91 /* [ */) {
        if (this.depth === 0 && this.arrayDepth === -1 && this.objStartDepth === -1) this.arrayDepth = 0;
        this.depth++;
      } else if (c === 125 /* } */ || c === 93 /* ] */) {
        this.depth--;
        if (this.depth < 0) {
          this.strayAt('a closing bracket with no opening one');
          this.depth = 0;
        }
        if (c === 125 && this.objStartDepth !== -1 && this.depth === this.objStartDepth) {
          this.parts.push(chunk.slice(segStart, i + 1));
          this.onObject(this.parts.join(''), this.objLine);
          this.parts = [];
          this.objStartDepth = -1;
          segStart = -1;
        }
      } else if (this.objStartDepth === -1 && c > 32 && c !== 44 /* , */) {
        this.strayAt('text outside any object');
      }
    }
    if (this.objStartDepth !== -1 && segStart !== -1) this.parts.push(chunk.slice(segStart));
  }

  end(): void {
    if (this.objStartDepth !== -1) this.onStray(this.objLine, 'an object that never closes (the file seems cut short)');
    else if (this.depth > 0) this.onStray(this.line, 'an array that never closes (the file seems cut short)');
  }

  private strayAt(what: string): void {
    if (this.stray) return; // one report is enough
    this.stray = true;
    this.onStray(this.line, what);
  }
}
