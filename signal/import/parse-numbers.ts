/**
 * A streaming parser from text bytes straight into Float64Array columns: a byte state machine, no per-row
 * strings or objects. Decimal digits that fit in 2^53 with a power of ten up to 10^22 convert exactly as
 * digits / 10^k; anything longer falls back to Number() on the field's bytes.
 */

export interface NumberParserOptions {
  delimiter: string;
  decimalComma: boolean;
  /** Fields per row. */
  width: number;
  /** Expected rows, to size the columns once. */
  rowsHint?: number;
  /** 1-based line number of the first byte pushed, for messages. @default 1 */
  firstLine?: number;
}

export interface FieldProblem {
  line: number;
  column: number;
  text: string;
}

export interface ParsedColumns {
  columns: Float64Array[];
  rows: number;
  /** Fields that held text other than a number (stored as NaN). */
  badFields: number;
  firstBadField: FieldProblem | null;
  /** Rows with fewer or more fields than the header. */
  raggedRows: number;
  firstRaggedLine: number | null;
  /** The file ended in the middle of a row (no final newline and a short row). */
  truncatedLastLine: boolean;
  /** Fields stored as NaN (empty, text, or missing from a short row): 0 means every column is complete. */
  missingValues: number;
}

/** No sample's number is longer than this many characters. */
const MAX_NUMBER_CHARS = 400;

const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i);
const MAX_EXACT = 2 ** 53;

export class NumberParser {
  private readonly delim: number;
  private readonly dec: number;
  private readonly width: number;
  private cols: Float64Array[];
  private cap: number;
  private rows = 0;
  private line: number;
  // Field state.
  private field = 0;
  private mant = 0;
  private frac = 0;
  private inFrac = false;
  private neg = false;
  private expo = 0;
  private expNeg = false;
  private inExp = false;
  private any = false;
  private bad = false;
  private slow = false;
  private text: number[] = [];
  private rowHasContent = false;
  private rowBad = false;
  private badFields = 0;
  private firstBad: FieldProblem | null = null;
  private ragged = 0;
  private firstRagged: number | null = null;
  private missing = 0;

  constructor(o: NumberParserOptions) {
    this.delim = o.delimiter.charCodeAt(0);
    this.dec = o.decimalComma ? 44 : 46;
    this.width = o.width;
    this.cap = Math.max(1024, o.rowsHint ?? 0);
    this.cols = Array.from({ length: o.width }, () => new Float64Array(this.cap));
    this.line = o.firstLine ?? 1;
  }

  /**
   * Parses a chunk; a row or field may continue into the next chunk. The loop keeps the plain case (digits, one
   * decimal mark, a leading minus, delimiters and complete rows) in local variables; anything else goes through
   * {@link general} with the state written back.
   */
  push(chunk: Uint8Array): void {
    const delim = this.delim;
    const dec = this.dec;
    const last = this.width - 1;
    let cols = this.cols;
    let cap = this.cap;
    let mant = this.mant;
    let frac = this.frac;
    let inFrac = this.inFrac;
    let neg = this.neg;
    let any = this.any;
    let field = this.field;
    let rows = this.rows;
    let content = this.rowHasContent;
    let line = this.line;
    let plain = !this.bad && !this.slow && !this.inExp && !this.rowBad;
    for (let i = 0; i < chunk.length; i++) {
      const b = chunk[i];
      if (plain) {
        if (b >= 48 && b <= 57) {
          // Below 10^14 one more digit keeps the mantissa under 10^15 < 2^53: exact.
          if (mant < 1e14) {
            mant = mant * 10 + (b - 48);
            if (inFrac) frac++;
            any = true;
            content = true;
            continue;
          }
        } else if (b === delim ? field < last : b === 10 && field === last && any) {
          if (rows >= cap) {
            this.rows = rows;
            this.ensure();
            cols = this.cols;
            cap = this.cap;
          }
          if (!any) this.missing++;
          const v = any ? (frac === 0 ? mant : mant / POW10[frac]) : NaN;
          cols[field][rows] = neg ? -v : v;
          mant = 0;
          frac = 0;
          inFrac = false;
          neg = false;
          any = false;
          if (b === delim) {
            field++;
          } else {
            rows++;
            field = 0;
            content = false;
            line++;
          }
          continue;
        } else if (b === dec) {
          if (!inFrac) {
            inFrac = true;
            continue;
          }
        } else if (b === 45) {
          if (!any && !inFrac && !neg) {
            neg = true;
            continue;
          }
        } else if (b === 13) {
          continue;
        }
      }
      this.mant = mant;
        this.frac = frac;
      this.inFrac = inFrac;
      this.neg = neg;
      this.any = any;
      this.field = field;
      this.rows = rows;
      this.rowHasContent = content;
      this.line = line;
      this.general(b);
      cols = this.cols;
      cap = this.cap;
      mant = this.mant;
      frac = this.frac;
      inFrac = this.inFrac;
      neg = this.neg;
      any = this.any;
      field = this.field;
      rows = this.rows;
      content = this.rowHasContent;
      line = this.line;
      plain = !this.bad && !this.slow && !this.inExp && !this.rowBad;
    }
    this.mant = mant;
    this.frac = frac;
    this.inFrac = inFrac;
    this.neg = neg;
    this.any = any;
    this.field = field;
    this.rows = rows;
    this.rowHasContent = content;
    this.line = line;
  }

  /** One byte of any kind, with the whole state on `this`. */
  private general(b: number): void {
    if (b >= 48 && b <= 57) {
      this.any = true;
      this.rowHasContent = true;
      if (this.inExp) {
        this.expo = this.expo * 10 + (b - 48);
        if (this.slow) this.keep(b);
      } else if (!this.slow && this.mant < 1e14) {
        this.mant = this.mant * 10 + (b - 48);
        if (this.inFrac) this.frac++;
      } else {
        if (!this.slow) this.startSlow();
        this.keep(b);
      }
      return;
    }
    if (b === this.delim) return this.endField();
    if (b === 10) return this.endRow();
    if (b === this.dec && !this.inFrac && !this.inExp) {
      this.inFrac = true;
      if (this.slow) this.keep(46);
      return;
    }
    if (b === 45 || b === 43) {
      // Sign of the number or of its exponent.
      if (this.inExp && this.expo === 0) this.expNeg = b === 45;
      else if (!this.any && !this.inFrac) this.neg = b === 45;
      else this.bad = true;
      if (this.slow) this.keep(b);
      return;
    }
    if ((b === 101 || b === 69) && this.any && !this.inExp) {
      this.inExp = true;
      if (this.slow) this.keep(b);
      return;
    }
    if (b === 13 || b === 32 || b === 34 || b === 9) return;
    // Any other byte: the field is not a number.
    this.bad = true;
    this.rowHasContent = true;
    if (this.text.length < 40) this.text.push(b);
  }

  /**
   * Keeps one byte of a long number's text. A field longer than any sample's number (a 200,000-digit field,
   * say) is not a number: it is marked bad rather than kept whole.
   */
  private keep(b: number): void {
    if (this.text.length < MAX_NUMBER_CHARS) this.text.push(b);
    else this.bad = true;
  }

  /** Switches the field to the exact fallback: its text so far, rebuilt from the state, then Number(). */
  private startSlow() {
    this.slow = true;
    const s = (this.neg ? '-' : '') + this.mantText();
    this.text = Array.from(s, (c) => c.charCodeAt(0));
  }

  private mantText(): string {
    if (!this.inFrac) return String(this.mant);
    const s = String(this.mant).padStart(this.frac + 1, '0');
    return `${s.slice(0, s.length - this.frac)}.${s.slice(s.length - this.frac)}`;
  }

  private value(): number {
    if (this.bad || !this.any) return NaN;
    if (this.slow) return Number(String.fromCharCode(...this.text).replace(',', '.'));
    const p = (this.expNeg ? -this.expo : this.expo) - this.frac;
    let v: number;
    if (p === 0) v = this.mant;
    else if (p < 0 && -p <= 22 && this.mant < MAX_EXACT) v = this.mant / POW10[-p];
    else if (p > 0 && p <= 22 && this.mant < MAX_EXACT) v = this.mant * POW10[p];
    else v = Number(`${this.mant}e${p}`);
    return this.neg ? -v : v;
  }

  private endField(): void {
    const v = this.value();
    if (v !== v) this.missing++;
    if (this.field < this.width) {
      this.ensure();
      this.cols[this.field][this.rows] = v;
    }
    if (this.bad && isMissingMarker(this.text)) this.bad = false;
    if (this.bad) {
      this.rowBad = true;
      if (!this.firstBad) this.firstBad = { line: this.line, column: this.field + 1, text: String.fromCharCode(...this.text.slice(0, 40)) };
    }
    this.field++;
    this.resetField();
  }

  private resetField() {
    this.mant = 0;
    this.frac = 0;
    this.inFrac = false;
    this.neg = false;
    this.expo = 0;
    this.expNeg = false;
    this.inExp = false;
    this.any = false;
    this.bad = false;
    this.slow = false;
    this.text.length = 0;
  }

  private endRow(): void {
    if (!this.rowHasContent && this.field === 0) {
      this.resetField();
      this.line++;
      return;
    }
    this.endField();
    if (this.field !== this.width) {
      this.ragged++;
      if (this.firstRagged === null) this.firstRagged = this.line;
      for (let f = this.field; f < this.width; f++) this.cols[f][this.rows] = NaN;
      this.missing += Math.max(0, this.width - this.field);
    }
    if (this.rowBad) this.badFields++;
    this.rows++;
    this.field = 0;
    this.rowHasContent = false;
    this.rowBad = false;
    this.line++;
  }

  private ensure(): void {
    if (this.rows < this.cap) return;
    const next = Math.ceil(this.cap * 1.5);
    this.cols = this.cols.map((c) => {
      const g = new Float64Array(next);
      g.set(c);
      return g;
    });
    this.cap = next;
  }

  /** Ends the input and returns the columns, trimmed to the rows read. */
  finish(): ParsedColumns {
    let truncated = false;
    if (this.rowHasContent || this.field > 0) {
      // The last line had no newline: keep it if complete, drop it if cut short.
      if (this.field + 1 === this.width && !this.bad && this.any) this.endRow();
      else {
        truncated = true;
        this.resetField();
      }
    }
    const columns = this.cols.map((c) => c.subarray(0, this.rows));
    this.cols = [];
    return {
      columns,
      rows: this.rows,
      badFields: this.badFields,
      firstBadField: this.firstBad,
      raggedRows: this.ragged,
      firstRaggedLine: this.firstRagged,
      truncatedLastLine: truncated,
      missingValues: this.missing,
    };
  }
}

/** "NaN", "nan", "-nan", "N/A", "inf": a missing value as loggers write it, not a broken file. */
function isMissingMarker(text: number[]): boolean {
  const t = String.fromCharCode(...text).toLowerCase();
  return t === 'nan' || t === 'n/a' || t === 'na' || t === 'inf' || t === 'infinity' || t === '-';
}
