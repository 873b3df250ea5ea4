import { depthProblem, joinField, keyProblem, MAX_JSON_DEPTH, refusedInput, stringProblem } from '../core/input-hygiene';
import { badRequest, type FieldError } from '../core/problem';
import type { ValueColumn } from './readings-columns';

/**
 * An incremental JSON parser for bodies that are mostly long arrays of numbers (readings): it reads
 * the body chunk by chunk as it arrives, and the arrays that `columnAt` names are kept as numbers in a
 * Float64Array (ValueColumn) rather than as millions of JS values; everything else is built as
 * JSON.parse would. The input hygiene of every other body is applied while reading: nesting deeper
 * than MAX_JSON_DEPTH, prototype keys and control characters are refused with the same 400.
 * Numbers are read exactly as JSON.parse reads them (a fast path where that is provably exact).
 */

/** The name of the column an array at this path becomes, or null for an ordinary array. */
export type ColumnAt = (path: ReadonlyArray<string | number>) => string | null;

export interface ParsedJson {
  /** The body, with every column array left empty ([]): its shape can be checked as usual. */
  value: unknown;
  /** The columns by name (the last one sent wins, as a repeated key does in JSON.parse). */
  columns: Map<string, ValueColumn>;
}

const OBJECT = 0;
const ARRAY = 1;
const COLUMN = 2;

interface Frame {
  kind: typeof OBJECT | typeof ARRAY | typeof COLUMN;
  /** The object or array being built (the empty stand-in array of a column). */
  value: Record<string, unknown> | unknown[];
  /** Where this frame sits in its parent. */
  at: string | number;
  key: string | null;
  /** Values read so far (arrays and columns). */
  index: number;
  column?: ColumnBuilder;
}

class ColumnBuilder {
  nums = new Float64Array(4096);
  length = 0;
  others = new Map<number, unknown>();

  private room(): void {
    if (this.length === this.nums.length) {
      const bigger = new Float64Array(this.nums.length * 2);
      bigger.set(this.nums);
      this.nums = bigger;
    }
  }

  push(n: number): void {
    this.room();
    this.nums[this.length++] = n;
  }

  pushOther(v: unknown): void {
    this.room();
    if (v !== null) this.others.set(this.length, v);
    this.nums[this.length++] = NaN;
  }

  done(): ValueColumn {
    return { length: this.length, nums: this.nums.subarray(0, this.length), others: this.others };
  }
}

// What the parser expects next.
const VALUE = 0; // a value (after ':' or at the start)
const VALUE_OR_CLOSE = 1; // after '['
const KEY_OR_CLOSE = 2; // after '{'
const KEY = 3; // after ',' in an object
const COLON = 4;
const COMMA_OR_CLOSE = 5;
const DONE = 6;
const STRING = 7;
const STRING_ESCAPE = 8;
const NUMBER = 9;
const LITERAL = 10;

// Number states: what was read last.
const N_MINUS = 1;
const N_ZERO = 2;
const N_INT = 3;
const N_DOT = 4;
const N_FRAC = 5;
const N_E = 6;
const N_E_SIGN = 7;
const N_EXP = 8;

/** 10⁰ … 10²², each exact in a double (Clinger's fast path). */
const POW10 = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));
const LITERALS: Record<number, [string, unknown]> = { 0x74: ['true', true], 0x66: ['false', false], 0x6e: ['null', null] };
const MAX_PROBLEMS = 20;

const invalid = (offset: number, what: string) => badRequest(`The request body is not valid JSON: ${what} at byte ${offset}.`);

export class ReadingsJsonParser {
  private state = VALUE;
  private readonly stack: Frame[] = [];
  private root: unknown = undefined;
  private readonly columns = new Map<string, ValueColumn>();
  private readonly problems: FieldError[] = [];
  /** Bytes of the body before the current chunk. */
  private offset = 0;
  private chunk: Buffer = Buffer.alloc(0);

  // The token being read, which may span chunks.
  private tokenStart = 0;
  private carry: Buffer[] = [];
  private stringIsKey = false;
  private stringEscaped = false;
  private stringHigh = false;
  private numState = 0;
  private numNeg = false;
  private mant = 0;
  private sig = 0;
  private frac = 0;
  private expNeg = false;
  private exp = 0;
  private slow = false;
  private literal = '';
  private literalValue: unknown = null;
  private literalPos = 0;

  constructor(private readonly columnAt: ColumnAt) {}

  /** Reads the next piece of the body. */
  write(bytes: Uint8Array): void {
    const buf = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    this.chunk = buf;
    const len = buf.length;
    let i = 0;
    while (i < len) {
      const c = buf[i];
      switch (this.state) {
        case NUMBER: {
          // The hot loop: digits of a number, most often inside a column.
          let s = this.numState;
          for (; i < len; i++) {
            const d = buf[i];
            if (d >= 0x30 && d <= 0x39) {
              const v = d - 0x30;
              if (s === N_MINUS) s = v === 0 ? N_ZERO : N_INT;
              else if (s === N_ZERO) throw invalid(this.offset + i, 'a number with a leading zero');
              else if (s === N_DOT) s = N_FRAC;
              else if (s === N_E || s === N_E_SIGN) s = N_EXP;
              if (s === N_EXP) {
                if (this.exp < 1e6) this.exp = this.exp * 10 + v;
              } else {
                if (this.mant !== 0 || v !== 0) {
                  if (this.sig < 15) {
                    this.mant = this.mant * 10 + v;
                    this.sig += 1;
                  } else this.slow = true;
                }
                if (s === N_FRAC) this.frac += 1;
              }
            } else if (d === 0x2e && (s === N_ZERO || s === N_INT)) s = N_DOT;
            else if ((d === 0x65 || d === 0x45) && (s === N_ZERO || s === N_INT || s === N_FRAC)) s = N_E;
            else if ((d === 0x2b || d === 0x2d) && s === N_E) {
              s = N_E_SIGN;
              this.expNeg = d === 0x2d;
            } else break;
          }
          this.numState = s;
          if (i === len) break; // the number may go on in the next chunk
          this.endNumber(i);
          continue; // the byte after the number is read in the new state
        }
        case STRING: {
          for (; i < len; i++) {
            const d = buf[i];
            if (d === 0x22 || d === 0x5c) break;
            if (d < 0x20) throw invalid(this.offset + i, 'a control character inside a string (it must be escaped)');
            if (d >= 0x80) this.stringHigh = true;
          }
          if (i === len) break;
          if (buf[i] === 0x5c) {
            this.stringEscaped = true;
            this.state = STRING_ESCAPE;
            i += 1;
            continue;
          }
          this.endString(i);
          i += 1;
          continue;
        }
        case STRING_ESCAPE:
          // The escaped byte itself; JSON.parse checks the escape when the string ends.
          this.state = STRING;
          i += 1;
          continue;
        case LITERAL:
          if (c !== this.literal.charCodeAt(this.literalPos)) throw invalid(this.offset + i, `an unknown word (expected ${this.literal})`);
          this.literalPos += 1;
          i += 1;
          if (this.literalPos === this.literal.length) this.value(this.literalValue);
          continue;
        default:
          break;
      }
      if (i >= len) break;
      const b = buf[i];
      if (b === 0x20 || b === 0x0a || b === 0x0d || b === 0x09) {
        i += 1;
        continue;
      }
      this.structural(b, i);
      i += 1;
    }
    // A token that goes on in the next chunk keeps its bytes so far.
    if (this.state === STRING || this.state === STRING_ESCAPE || this.state === NUMBER) {
      this.carry.push(Buffer.from(buf.subarray(this.tokenStart, len)));
    }
    this.tokenStart = 0;
    this.offset += len;
  }

  /** The body is complete: the parsed value and its columns, or a 400. */
  end(): ParsedJson {
    if (this.offset === 0) return { value: {}, columns: this.columns }; // as express.json: an empty body is {}
    if (this.state !== DONE) throw invalid(this.offset, 'the body ends before its last value does');
    if (this.problems.length) throw refusedInput(this.problems, 'request body');
    return { value: this.root, columns: this.columns };
  }

  private field(extra?: string | number): string {
    let path = '';
    for (let k = 1; k < this.stack.length; k++) path = joinField(path, this.stack[k].at);
    if (extra !== undefined) path = joinField(path, extra);
    return path || '(body)';
  }

  private problem(p: FieldError | null): void {
    if (p && this.problems.length < MAX_PROBLEMS) this.problems.push(p);
  }

  private structural(b: number, i: number): void {
    const state = this.state;
    if (state === VALUE || state === VALUE_OR_CLOSE || state === KEY_OR_CLOSE || state === KEY) {
      if (b === 0x22) {
        this.stringIsKey = state === KEY_OR_CLOSE || state === KEY;
        this.startString(i);
        return;
      }
      if (state === KEY_OR_CLOSE && b === 0x7d) return this.close(OBJECT, i);
      if (state === KEY || state === KEY_OR_CLOSE) throw invalid(this.offset + i, 'a field name in double quotes expected');
      if (state === VALUE_OR_CLOSE && b === 0x5d) return this.close(ARRAY, i);
      if (b === 0x7b) return this.open(OBJECT, i);
      if (b === 0x5b) return this.open(ARRAY, i);
      if (b === 0x2d || (b >= 0x30 && b <= 0x39)) return this.startNumber(b, i);
      const literal = LITERALS[b];
      if (literal) {
        [this.literal, this.literalValue] = literal;
        this.literalPos = 1;
        this.state = LITERAL;
        return;
      }
      throw invalid(this.offset + i, 'a value expected');
    }
    if (state === COLON) {
      if (b !== 0x3a) throw invalid(this.offset + i, '":" expected');
      this.state = VALUE;
      return;
    }
    if (state === COMMA_OR_CLOSE) {
      const top = this.stack[this.stack.length - 1];
      if (b === 0x2c) {
        this.state = top.kind === OBJECT ? KEY : VALUE;
        return;
      }
      if (b === 0x7d && top.kind === OBJECT) return this.close(OBJECT, i);
      if (b === 0x5d && top.kind !== OBJECT) return this.close(ARRAY, i);
      throw invalid(this.offset + i, `"," or "${top.kind === OBJECT ? '}' : ']'}" expected`);
    }
    throw invalid(this.offset + i, 'more after the end of the body');
  }

  private open(kind: typeof OBJECT | typeof ARRAY, i: number): void {
    const parent = this.stack[this.stack.length - 1];
    const at = parent ? (parent.kind === OBJECT ? parent.key! : parent.index) : '';
    if (this.stack.length >= MAX_JSON_DEPTH) throw refusedInput([...this.problems, depthProblem(this.field(at))].slice(0, MAX_PROBLEMS), 'request body');
    if (this.stack.length === 0 && this.root !== undefined) throw invalid(this.offset + i, 'more after the end of the body');
    let frame: Frame;
    if (kind === ARRAY && parent?.kind !== COLUMN) {
      const path = this.stack.slice(1).map((f) => f.at);
      path.push(at);
      const name = this.columnAt(path);
      frame = name !== null ? { kind: COLUMN, value: [], at, key: name, index: 0, column: new ColumnBuilder() } : { kind: ARRAY, value: [], at, key: null, index: 0 };
    } else {
      frame = { kind, value: kind === OBJECT ? {} : [], at, key: null, index: 0 };
    }
    this.stack.push(frame);
    this.state = kind === OBJECT ? KEY_OR_CLOSE : VALUE_OR_CLOSE;
  }

  private close(kind: typeof OBJECT | typeof ARRAY, i: number): void {
    const frame = this.stack.pop();
    if (!frame || (kind === OBJECT) !== (frame.kind === OBJECT)) throw invalid(this.offset + i, 'a bracket that closes nothing');
    if (frame.kind === COLUMN) this.columns.set(frame.key!, frame.column!.done());
    this.value(frame.value);
  }

  /** A complete value: into its parent (or as the body). */
  private value(v: unknown): void {
    const top = this.stack[this.stack.length - 1];
    if (!top) {
      if (v === null || typeof v !== 'object') throw invalid(this.offset, 'the body must be a JSON object');
      this.root = v;
      this.state = DONE;
      return;
    }
    if (top.kind === OBJECT) {
      const key = top.key!;
      // Prototype keys were refused when read; the body will be refused, and is never given one.
      if (keyProblem(key, '') === null) (top.value as Record<string, unknown>)[key] = v;
    } else if (top.kind === ARRAY) (top.value as unknown[]).push(v);
    else top.column!.pushOther(v);
    top.index += 1;
    this.state = COMMA_OR_CLOSE;
  }

  private startString(i: number): void {
    this.state = STRING;
    this.tokenStart = i + 1;
    this.carry = [];
    this.stringEscaped = false;
    this.stringHigh = false;
  }

  private endString(i: number): void {
    const head = this.chunk.subarray(this.tokenStart, i);
    const raw = this.carry.length ? Buffer.concat([...this.carry, head]) : head;
    this.carry = [];
    let s: string;
    if (this.stringEscaped) {
      try {
        s = JSON.parse(`"${raw.toString('utf8')}"`) as string;
      } catch {
        throw invalid(this.offset + i, 'a bad escape in a string');
      }
    } else s = raw.toString(this.stringHigh ? 'utf8' : 'latin1');
    const top = this.stack[this.stack.length - 1];
    if (!top) return this.value(s); // a string as the whole body: refused there
    if (this.stringIsKey) {
      top.key = s;
      this.problem(keyProblem(s, this.field(s)));
      this.state = COLON;
      return;
    }
    this.problem(stringProblem(s, this.field(top.kind === OBJECT ? top.key! : top.index)));
    this.value(s);
  }

  private startNumber(b: number, i: number): void {
    this.state = NUMBER;
    this.tokenStart = i;
    this.carry = [];
    this.numNeg = b === 0x2d;
    this.numState = this.numNeg ? N_MINUS : b === 0x30 ? N_ZERO : N_INT;
    this.mant = this.numNeg ? 0 : b - 0x30;
    this.sig = this.mant === 0 ? 0 : 1;
    this.frac = 0;
    this.expNeg = false;
    this.exp = 0;
    this.slow = false;
  }

  private endNumber(i: number): void {
    const s = this.numState;
    if (s !== N_ZERO && s !== N_INT && s !== N_FRAC && s !== N_EXP) throw invalid(this.offset + i, 'an unfinished number');
    const e10 = (this.expNeg ? -this.exp : this.exp) - this.frac;
    let v: number;
    if (!this.slow && e10 >= -22 && e10 <= 22) {
      // Both the digits (fewer than 16) and the power of ten are exact doubles: one correctly rounded operation.
      v = e10 >= 0 ? this.mant * POW10[e10] : this.mant / POW10[-e10];
      if (this.numNeg) v = -v;
    } else {
      const head = this.chunk.toString('latin1', this.tokenStart, i);
      v = Number(this.carry.length ? Buffer.concat(this.carry).toString('latin1') + head : head);
    }
    this.carry = [];
    const top = this.stack[this.stack.length - 1];
    if (top?.kind === COLUMN) {
      top.column!.push(v);
      top.index += 1;
      this.state = COMMA_OR_CLOSE;
    } else this.value(v);
  }
}

/** Parses a whole body given as chunks (an async iterable, such as a request). */
export async function parseReadingsJson(chunks: AsyncIterable<Uint8Array>, columnAt: ColumnAt): Promise<ParsedJson> {
  const parser = new ReadingsJsonParser(columnAt);
  for await (const chunk of chunks) parser.write(chunk);
  return parser.end();
}
