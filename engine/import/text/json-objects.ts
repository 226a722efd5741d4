/**
 * Streams the records of a JSON event file one object at a time, without holding the
 * whole text: a small scanner tracks strings and nesting, and each complete record object
 * is handed to JSON.parse on its own. Three shapes:
 * - an array of objects: `[{...}, {...}]`;
 * - JSON Lines / concatenated objects: `{...}\n{...}`;
 * - a wrapper object whose array fields hold the records, e.g. `{"teams": {...}, "events": [{...}]}`
 *   (told from JSON Lines by the first object running over more than one line).
 */
export class JsonObjectSplitter {
  private stack: number[] = []; // open brackets: 123 '{' or 91 '['
  private inString = false;
  private escape = false;
  private mode: 'unknown' | 'array' | 'lines' | 'wrapper' = 'unknown';
  private recording = false;
  private recordDepth = 0;
  private parts: string[] = [];
  private line = 1;
  private recordLine = 1;
  private records = 0;
  private stray = false;

  constructor(
    private readonly onObject: (text: string, line: number) => void,
    private readonly onStray: (line: number, what: string) => void,
  ) {}

  push(chunk: string): void {
    let segStart = this.recording ? 0 : -1;
    const stack = this.stack;
    for (let i = 0; i < chunk.length; i++) {
      const c = chunk.charCodeAt(i);
      if (c === 10) {
        this.line++;
        // A first root object running over lines is a wrapper, not JSON Lines.
        if (this.recording && this.mode === 'lines' && this.recordDepth === 0 && this.records === 0 && !this.inString) {
          this.mode = 'wrapper';
          this.recording = false;
          this.parts = [];
          segStart = -1;
        }
        continue;
      }
      if (this.inString) {
        if (this.escape) this.escape = false;
        else if (c === 92) this.escape = true;
        else if (c === 34) this.inString = false;
        continue;
      }
      if (c === 34) {
        this.inString = true;
        if (!this.recording && stack.length === 0) this.strayAt('a string outside any object');
      } else if (c === 123 /* { */) {
        if (!this.recording && this.isRecordStart()) {
          if (this.mode === 'unknown') this.mode = 'lines';
          this.recording = true;
          this.recordDepth = stack.length;
          this.recordLine = this.line;
          this.parts = [];
          segStart = i;
        }
        stack.push(123);
      } else if (c === 91 /* [ */) {
        if (stack.length === 0 && this.mode === 'unknown') this.mode = 'array';
        stack.push(91);
      } else if (c === 125 /* } */ || c === 93 /* ] */) {
        const open = stack.pop();
        if (open === undefined || (open === 123) !== (c === 125)) {
          this.strayAt(open === undefined ? 'a closing bracket with no opening one' : 'brackets that do not match');
          if (open !== undefined) stack.push(open);
          continue;
        }
        if (c === 125 && this.recording && stack.length === this.recordDepth) {
          this.parts.push(chunk.slice(segStart, i + 1));
          this.recording = false;
          segStart = -1;
          this.records++;
          this.onObject(this.parts.join(''), this.recordLine);
          this.parts = [];
        }
      } else if (!this.recording && c > 32 && c !== 44 /* , */ && c !== 58 /* : */ && (stack.length === 0 || (this.mode === 'array' && stack.length === 1))) {
        this.strayAt('text outside any object');
      }
    }
    if (this.recording && segStart !== -1) this.parts.push(chunk.slice(segStart));
  }

  end(): void {
    if (this.recording) this.onStray(this.recordLine, 'an object that never closes (the file seems cut short)');
    else if (this.stack.length > 0) this.onStray(this.line, 'a bracket that never closes (the file seems cut short)');
  }

  /** Whether an object opening here is a record, given the shape seen so far. */
  private isRecordStart(): boolean {
    const s = this.stack;
    if (s.length === 0) return this.mode !== 'array' && this.mode !== 'wrapper';
    if (this.mode === 'array') return s.length === 1 && s[0] === 91;
    if (this.mode === 'wrapper') return s.length === 2 && s[0] === 123 && s[1] === 91;
    return false;
  }

  private strayAt(what: string): void {
    if (this.stray) return; // one report is enough
    this.stray = true;
    this.onStray(this.line, what);
  }
}
