// Hand-written byte-level parser: general CSV packages were 7–25× slower on this workload (STACK trial runs).
import { resolveColumns, unitFromHeader, type ColumnMapping, type StandardColumn, STANDARD_COLUMNS } from './columns';
import { IssueCollector, rowLabel } from './issues';

/** Columnar rows handed over per chunk; arrays are reused, valid until the callback returns. */
export interface RowBatch {
  count: number;
  /** Dense track index (see `trackNames`). */
  track: Int32Array;
  /** 1-based line number in the file. */
  line: Int32Array;
  /** Values per standard column (NaN where absent or non-finite); only mapped numeric columns are present. */
  values: Partial<Record<Exclude<StandardColumn, 'track_id'>, Float64Array>>;
}

export interface FileLayout {
  delimiter: ',' | ';' | '\t' | ' ';
  decimalSeparator: '.' | ',';
  hasHeader: boolean;
  header: string[] | null;
  bom: boolean;
  lineEnding: 'LF' | 'CRLF' | null;
  fieldCount: number;
  columns: Partial<Record<StandardColumn, number>>;
  columnSources: Partial<Record<StandardColumn, string>>;
  /** Length unit announced by a position header such as "x (mm)". */
  headerUnit: 'm' | 'cm' | 'mm' | 'px' | null;
}

export interface ParserOptions {
  mapping?: ColumnMapping;
  hasHeader?: boolean | null;
  maxLineBytes: number;
  maxErrorRows: number;
  issues: IssueCollector;
  onLayout(layout: FileLayout): boolean;
  onRows(batch: RowBatch): void;
}

const NUMERIC: Exclude<StandardColumn, 'track_id'>[] = ['frame', 't', 'x', 'y', 'z', 'vx', 'vy', 'vz', 'ax', 'ay', 'az'];
const POW10 = Array.from({ length: 23 }, (_, i) => Number(`1e${i}`));
const TWO53 = 9007199254740992;
const NONFINITE_WORDS = new Set(['nan', '-nan', 'inf', '-inf', '+inf', 'infinity', '-infinity', '+infinity', 'na', 'n/a', 'null', 'none', '']);

/** Outcome of the last {@link parseNumberBytes}: 0 number, 1 missing/non-finite word, 2 not a number. */
let status = 0;

/**
 * Parses a decimal number in bytes [s, e) (surrounding spaces and quotes
 * allowed). Fast path exact for ≤ 15 significant digits and |exponent| ≤ 22
 * (Clinger, "How to read floating point numbers accurately", PLDI 1990);
 * otherwise falls back to Number().
 */
export function parseNumberBytes(b: Uint8Array, s: number, e: number, decimalComma: boolean): number {
  while (s < e && (b[s] === 32 || b[s] === 34)) s++;
  while (e > s && (b[e - 1] === 32 || b[e - 1] === 34)) e--;
  status = 0;
  let i = s;
  let neg = false;
  if (i < e && (b[i] === 45 || b[i] === 43)) {
    neg = b[i] === 45;
    i++;
  }
  let mant = 0;
  let digits = 0;
  let exp = 0;
  let c = 0;
  while (i < e && (c = b[i] - 48) >= 0 && c <= 9) {
    mant = mant * 10 + c;
    digits++;
    i++;
  }
  if (i < e && (b[i] === 46 || (decimalComma && b[i] === 44))) {
    i++;
    while (i < e && (c = b[i] - 48) >= 0 && c <= 9) {
      mant = mant * 10 + c;
      digits++;
      exp--;
      i++;
    }
  }
  if (digits > 0 && i < e && (b[i] | 32) === 101) {
    i++;
    let eneg = false;
    if (i < e && (b[i] === 45 || b[i] === 43)) {
      eneg = b[i] === 45;
      i++;
    }
    let ev = 0;
    let ed = 0;
    while (i < e && (c = b[i] - 48) >= 0 && c <= 9) {
      ev = ev * 10 + c;
      ed++;
      i++;
    }
    if (ed === 0) i = -1;
    exp += eneg ? -ev : ev;
  }
  if (i === e && digits > 0) {
    if (mant < TWO53 && exp >= -22 && exp <= 22) {
      const v = exp < 0 ? mant / POW10[-exp] : mant * POW10[exp];
      return neg ? -v : v;
    }
    let str = '';
    for (let k = s; k < e; k++) str += String.fromCharCode(decimalComma && b[k] === 44 ? 46 : b[k]);
    return Number(str);
  }
  let str = '';
  for (let k = s; k < e && k < s + 40; k++) str += String.fromCharCode(b[k]);
  if (NONFINITE_WORDS.has(str.toLowerCase())) {
    status = 1;
    return NaN;
  }
  status = 2;
  return NaN;
}

const decoder = new TextDecoder('utf-8');

/** Text of bytes [s, e) for messages (UTF-8, at most 40 characters). */
function textOf(b: Uint8Array, s: number, e: number): string {
  const t = decoder.decode(b.subarray(s, Math.min(e, s + 120))).trim().replace(/^"|"$/g, '');
  return t.length > 40 ? `${t.slice(0, 40)}…` : t;
}

/**
 * Streaming delimited-text parser over Uint8Array chunks: detects BOM,
 * delimiter (comma, semicolon, tab, spaces), header and line endings; parses
 * mapped columns straight from bytes into typed arrays; reports each problem
 * with its row. Pure: no Node APIs.
 */
export class DelimitedTextParser {
  private leftover: Uint8Array = new Uint8Array(0);
  private lineNo = 0;
  private layout: FileLayout | null = null;
  private sawBytes = false;
  private sawBom = false;
  private crlf: boolean | null = null;
  /** True once a fatal problem stopped reading. */
  stopped = false;
  dataRows = 0;
  readonly trackNames: string[] = [];
  private readonly trackByNumber = new Map<number, number>();
  private readonly trackByName = new Map<string, number>();
  private smallIds = new Int32Array(1024);
  private actions = new Int8Array(0);
  private maxNeeded = 0;
  private delim = 44;
  private decimalComma = false;
  private cap = 0;
  private batch: RowBatch = { count: 0, track: new Int32Array(0), line: new Int32Array(0), values: {} };
  private cols: Float64Array[] = [];

  constructor(private readonly opts: ParserOptions) {}

  get fileLayout(): FileLayout | null {
    return this.layout;
  }

  /** Layout for {@link parseDataBlock}; null before the header or for space-separated files. */
  blockLayout(): BlockLayout | null {
    if (!this.layout || this.delim === 32 || this.stopped) return null;
    const columns = NUMERIC.filter((k) => this.layout!.columns[k] !== undefined);
    const columnIndex = Int32Array.from(this.actions, (a) => (a > 0 ? columns.indexOf(NUMERIC[a - 1]) : -1));
    return { delimiter: this.delim, decimalComma: this.decimalComma, fieldCount: this.layout.fieldCount, actions: this.actions.slice(), columns, columnIndex };
  }

  /** Hands over the bytes after the last line break (the caller then feeds whole lines only). */
  takeLeftover(): Uint8Array {
    const l = this.leftover;
    this.leftover = new Uint8Array(0);
    return l;
  }

  /**
   * Accepts the rows of a block of whole lines parsed by {@link parseDataBlock} (e.g. in a worker), in file
   * order: numbers the lines and maps the track ids exactly as {@link push} would have.
   */
  pushParsed(p: ParsedBlock, lines: number): void {
    if (this.stopped || p.count === 0) return;
    const n = p.count;
    const track = new Int32Array(n);
    const line = new Int32Array(n);
    for (let k = 0; k < n; k++) {
      const v = p.trackIds[k];
      if (v >= this.smallIds.length) {
        const grown = new Int32Array(Math.max(v + 1, this.smallIds.length * 2));
        grown.set(this.smallIds);
        this.smallIds = grown;
      }
      let t = this.smallIds[v];
      if (t === 0) {
        t = this.newTrack(String(v)) + 1;
        this.smallIds[v] = t;
      }
      track[k] = t - 1;
      line[k] = this.lineNo + 1 + k;
    }
    this.lineNo += lines;
    this.dataRows += n;
    this.opts.onRows({ count: n, track, line, values: p.values });
  }

  /** Feeds the next chunk of bytes. */
  push(chunk: Uint8Array): void {
    if (this.stopped || chunk.length === 0) return;
    if (!this.sawBytes) {
      this.sawBytes = true;
      if (!this.sniff(chunk)) return;
      if (chunk[0] === 0xef && chunk[1] === 0xbb && chunk[2] === 0xbf) {
        this.sawBom = true;
        chunk = chunk.subarray(3);
      }
    }
    let start = 0;
    if (this.leftover.length > 0) {
      const nl = chunk.indexOf(10);
      if (nl < 0) {
        if (this.leftover.length + chunk.length > this.opts.maxLineBytes) return this.tooLong();
        this.leftover = concat(this.leftover, chunk);
        return;
      }
      const line = concat(this.leftover, chunk.subarray(0, nl + 1));
      this.leftover = new Uint8Array(0);
      this.parseRange(line, 0, line.length);
      this.flush();
      start = nl + 1;
      if (this.stopped) return;
    }
    const last = chunk.lastIndexOf(10);
    if (last < start) {
      if (chunk.length - start > this.opts.maxLineBytes) return this.tooLong();
      this.leftover = chunk.slice(start);
      return;
    }
    this.parseRange(chunk, start, last + 1);
    this.flush();
    if (this.stopped) return;
    if (chunk.length - (last + 1) > this.opts.maxLineBytes) return this.tooLong();
    this.leftover = chunk.slice(last + 1);
  }

  /** Signals the end of input. */
  end(): void {
    if (this.stopped) return;
    if (this.leftover.length > 0) {
      const line = this.leftover;
      this.leftover = new Uint8Array(0);
      this.parseRange(line, 0, line.length);
      this.flush();
    }
    if (this.stopped) return;
    if (!this.sawBytes) {
      this.opts.issues.add('empty-file', 'The file is empty: it contains no bytes.');
      this.stopped = true;
    } else if (!this.layout) {
      this.opts.issues.add('empty-file', 'The file contains only blank lines or comments: no header and no data.');
      this.stopped = true;
    } else if (this.dataRows === 0 && !this.opts.issues.hasErrors) {
      this.opts.issues.add('no-data-rows', this.layout.hasHeader ? 'The file has a header line but no data rows below it.' : 'The file has no data rows.');
    }
  }

  private tooLong(): void {
    const row = this.lineNo + 1;
    this.opts.issues.add(
      'line-too-long',
      `${rowLabel(row)}: the line is longer than ${Math.round(this.opts.maxLineBytes / 1024).toLocaleString('en-US')} KB without a line break — this is not a table of trajectories (or the line breaks are missing).`,
      row,
    );
    this.stopped = true;
  }

  /** Refuses binary content from the first bytes. */
  private sniff(chunk: Uint8Array): boolean {
    const b0 = chunk[0], b1 = chunk[1];
    let why = '';
    if (b0 === 0x1f && b1 === 0x8b) why = 'it is gzip-compressed data that could not be decompressed here';
    else if (b0 === 0x50 && b1 === 0x4b) why = 'it looks like a ZIP archive — unzip it and upload the CSV or TSV file inside';
    else {
      const n = Math.min(chunk.length, 8192);
      let control = 0;
      for (let i = 0; i < n; i++) {
        const c = chunk[i];
        if (c === 0) {
          control = n;
          break;
        }
        if (c < 9 || (c > 13 && c < 32) || c === 127) control++;
      }
      if (control > n * 0.01) why = 'it contains binary (non-text) bytes';
    }
    if (!why) return true;
    this.opts.issues.add('binary-content', `This is not a text table: ${why}. Upload a CSV or TSV file (plain or .gz).`, 1);
    this.stopped = true;
    return false;
  }

  private ensureCapacity(n: number): void {
    if (n <= this.cap) return;
    const cap = Math.max(n, this.cap * 2, 1024);
    this.cap = cap;
    this.batch.track = new Int32Array(cap);
    this.batch.line = new Int32Array(cap);
    const values: RowBatch['values'] = {};
    this.cols = [];
    for (const k of NUMERIC)
      if (this.layout!.columns[k] !== undefined) {
        values[k] = new Float64Array(cap);
      }
    this.batch.values = values;
    this.cols = NUMERIC.map((k) => values[k] ?? new Float64Array(0));
  }

  private flush(): void {
    if (this.batch.count > 0) {
      this.opts.onRows(this.batch);
      this.batch.count = 0;
    }
  }

  private handleHeaderLine(b: Uint8Array, s: number, e: number): boolean {
    const text = decoder.decode(b.subarray(s, e));
    if (text.includes('\u0000') || text.includes('\ufffd\ufffd\ufffd')) {
      this.opts.issues.add('binary-content', 'This is not a text table: the first line contains binary bytes. Upload a CSV or TSV file (plain or .gz).', this.lineNo);
      this.stopped = true;
      return false;
    }
    const counts = { ',': count(text, ','), ';': count(text, ';'), '\t': count(text, '\t') };
    let delimiter: FileLayout['delimiter'] = ',';
    if (counts['\t'] > 0 && counts['\t'] >= counts[','] && counts['\t'] >= counts[';']) delimiter = '\t';
    else if (counts[';'] > counts[',']) delimiter = ';';
    else if (counts[','] === 0 && /\S\s+\S/.test(text)) delimiter = ' ';
    const fields = delimiter === ' ' ? text.trim().split(/\s+/) : text.split(delimiter);
    const decimalComma = delimiter !== ',';
    this.delim = delimiter.charCodeAt(0);
    this.decimalComma = decimalComma;
    const enc = new TextEncoder();
    const numeric = fields.map((f) => {
      const bytes = enc.encode(f);
      parseNumberBytes(bytes, 0, bytes.length, decimalComma);
      return status === 0;
    });
    const hasHeader = this.opts.hasHeader ?? !numeric.some(Boolean);
    const header = hasHeader ? fields.map((f) => f.trim().replace(/^"|"$/g, '')) : null;
    const resolved = resolveColumns(header, fields.length, this.opts.mapping);
    const layout: FileLayout = {
      delimiter,
      decimalSeparator: decimalComma && /\d,\d/.test(text) ? ',' : '.',
      hasHeader,
      header,
      bom: this.sawBom,
      lineEnding: this.crlf === null ? null : this.crlf ? 'CRLF' : 'LF',
      fieldCount: fields.length,
      columns: resolved.index,
      columnSources: resolved.source,
      headerUnit: header ? (['x', 'y', 'z'] as const).map((k) => (resolved.index[k] !== undefined ? unitFromHeader(header[resolved.index[k]!]) : null)).find(Boolean) ?? null : null,
    };
    this.layout = layout;
    if (resolved.problems.length > 0) {
      this.opts.issues.add('invalid-mapping', `The column mapping does not fit this file: ${resolved.problems.join('; ')}.`, this.lineNo);
      this.stopped = true;
      return false;
    }
    const missing: string[] = [];
    if (resolved.index.track_id === undefined) missing.push('a track identifier (track_id)');
    if (resolved.index.frame === undefined && resolved.index.t === undefined) missing.push('a frame number or a time (frame or t)');
    for (const k of ['x', 'y'] as const) if (resolved.index[k] === undefined) missing.push(`position ${k}`);
    if (missing.length > 0) {
      const found = header ? `The header has: ${header.join(', ')}.` : 'The file has no header line.';
      this.opts.issues.add(
        'missing-columns',
        `Cannot find ${missing.join(', ')}. ${found} Name the columns track_id, frame (or t), x, y[, z], or give a column mapping.`,
        this.lineNo,
      );
      this.stopped = true;
      return false;
    }
    this.actions = new Int8Array(fields.length).fill(-1);
    this.maxNeeded = 0;
    STANDARD_COLUMNS.forEach((k, code) => {
      const i = resolved.index[k];
      if (i !== undefined) {
        this.actions[i] = code;
        this.maxNeeded = Math.max(this.maxNeeded, i + 1);
      }
    });
    if (!this.opts.onLayout(layout)) {
      this.stopped = true;
      return false;
    }
    // Batches of 16k rows: few callbacks, columns still small enough for the cache.
    this.ensureCapacity(1 << 14);
    return hasHeader;
  }

  private trackIndex(b: Uint8Array, s: number, e: number): number {
    const v = parseNumberBytes(b, s, e, false);
    if (status === 0) {
      if (v >= 0 && v < 4194304 && Number.isInteger(v)) {
        if (v >= this.smallIds.length) {
          const grown = new Int32Array(Math.max(v + 1, this.smallIds.length * 2));
          grown.set(this.smallIds);
          this.smallIds = grown;
        }
        const k = this.smallIds[v];
        if (k > 0) return k - 1;
        const idx = this.newTrack(String(v));
        this.smallIds[v] = idx + 1;
        return idx;
      }
      let idx = this.trackByNumber.get(v);
      if (idx === undefined) {
        idx = this.newTrack(String(v));
        this.trackByNumber.set(v, idx);
      }
      return idx;
    }
    if (status === 1 && textOf(b, s, e) === '') return -1;
    const name = textOf(b, s, e);
    let idx = this.trackByName.get(name);
    if (idx === undefined) {
      idx = this.newTrack(name);
      this.trackByName.set(name, idx);
    }
    return idx;
  }

  private newTrack(name: string): number {
    this.trackNames.push(name);
    return this.trackNames.length - 1;
  }

  private parseRange(b: Uint8Array, from: number, to: number): void {
    const issues = this.opts.issues;
    let ls = from;
    let fast = this.layout !== null && this.delim !== 32;
    while (ls < to && !this.stopped) {
      if (fast) {
        if (this.batch.count >= this.cap) this.flush();
        const next = this.parseLineFast(b, ls, to);
        if (next >= 0) {
          ls = next;
          continue;
        }
        if (this.stopped) return;
      }
      let le = b.indexOf(10, ls);
      if (le < 0 || le >= to) le = to;
      const next = le + 1;
      this.lineNo++;
      if (le - ls > this.opts.maxLineBytes) {
        this.lineNo--;
        return this.tooLong();
      }
      let e = le;
      if (e > ls && b[e - 1] === 13) {
        e--;
        if (this.crlf === null) this.crlf = true;
      } else if (le < to && this.crlf === null) this.crlf = false;
      let p = ls;
      while (p < e && (b[p] === 32 || b[p] === 9) && this.delim !== 9) p++;
      if (p === e || b[p] === 35) {
        ls = next;
        continue;
      }
      if (!this.layout) {
        const isHeader = this.handleHeaderLine(b, ls, e);
        if (this.stopped) return;
        fast = this.delim !== 32;
        if (this.layout) (this.layout as FileLayout).lineEnding = this.crlf === null ? null : this.crlf ? 'CRLF' : 'LF';
        if (isHeader) {
          ls = next;
          continue;
        }
      }
      if (issues.errorRows >= this.opts.maxErrorRows) {
        this.stopped = true;
        return;
      }
      this.parseLine(b, ls, e);
      ls = next;
    }
  }

  /**
   * Fast path for the common line: unquoted plain decimals (≤ 15 digits, no exponent), a small non-negative
   * integer track id, exactly the header's field count. Parses the line at `s` (ending before `to`) and returns
   * the start of the next line, or −1 when the line needs the general path (which then parses it from scratch).
   * Values are exact: mantissa < 2^53 divided by a power of ten ≤ 10^22 is correctly rounded (Clinger, PLDI 1990).
   */
  private parseLineFast(b: Uint8Array, s: number, to: number): number {
    const k = this.batch.count;
    const actions = this.actions;
    const nActions = actions.length;
    const delim = this.delim;
    const comma = this.decimalComma ? 44 : -1;
    const cols = this.cols;
    let i = s;
    let field = 0;
    let track = -1;
    let c = 0;
    // Hot loop: one pass over the bytes of the line, numbers accumulated as they are scanned.
    for (;;) {
      let neg = false;
      if (b[i] === 45) {
        neg = true;
        i++;
      }
      let mant = 0, digits = 0, frac = 0;
      for (; i < to; i++) {
        c = b[i] - 48;
        if (c < 0 || c > 9) break;
        mant = mant * 10 + c;
        digits++;
      }
      c = i < to ? b[i] : 10;
      if (c === 46 || c === comma) {
        for (i++; i < to; i++) {
          c = b[i] - 48;
          if (c < 0 || c > 9) break;
          mant = mant * 10 + c;
          digits++;
          frac++;
        }
        c = i < to ? b[i] : 10;
      }
      if (digits === 0 || digits > 15) return -1;
      const action = field < nActions ? actions[field] : -1;
      if (action === 0) {
        if (neg || frac > 0 || mant >= this.smallIds.length) return -1;
        const known = this.smallIds[mant];
        if (known > 0) track = known - 1;
        else {
          track = this.newTrack(String(mant));
          this.smallIds[mant] = track + 1;
        }
      } else if (action > 0) {
        const v = frac === 0 ? mant : mant / POW10[frac];
        cols[action - 1][k] = neg ? -v : v;
      }
      field++;
      if (c === delim) {
        i++;
        continue;
      }
      break;
    }
    // End of line: LF, CRLF, or the end of the range (last line of the input).
    let next: number;
    if (c === 10) next = i + 1;
    else if (c === 13 && i + 1 < to && b[i + 1] === 10) next = i + 2;
    else return -1;
    if (field !== this.layout!.fieldCount || track < 0) return -1;
    if (i >= to) {
      // A line without a line break ends the input: only the general path knows (end()).
      return -1;
    }
    if (this.crlf === null) this.crlf = c === 13;
    if (this.opts.issues.errorRows >= this.opts.maxErrorRows) return -1;
    this.lineNo++;
    this.dataRows++;
    this.batch.track[k] = track;
    this.batch.line[k] = this.lineNo;
    this.batch.count = k + 1;
    return next;
  }

  private parseLine(b: Uint8Array, s: number, e: number): void {
    const issues = this.opts.issues;
    const layout = this.layout!;
    const row = this.lineNo;
    const k = this.batch.count;
    if (k >= this.cap) {
      this.flush();
      return this.parseLine(b, s, e);
    }
    const actions = this.actions;
    const delim = this.delim;
    const spaces = delim === 32;
    const cols = this.cols;
    let field = 0;
    let fs = s;
    let ok = true;
    let track = -1;
    for (const c of cols) if (c.length > 0) c[k] = NaN;
    let i = s;
    if (spaces) while (i < e && b[i] === 32) i++;
    fs = i;
    for (;;) {
      let fe = i;
      if (b[i] === 34) {
        // Quoted field: skip to the closing quote.
        let q = i + 1;
        while (q < e && b[q] !== 34) q++;
        fe = q;
        while (fe < e && b[fe] !== delim) fe++;
      } else {
        while (fe < e && b[fe] !== delim) fe++;
      }
      const action = field < actions.length ? actions[field] : -1;
      if (action === 0) {
        track = this.trackIndex(b, fs, fe);
        if (track < 0) {
          issues.add('missing-value', () => `${rowLabel(row)}: the track identifier (column ${layout.columnSources.track_id}) is empty.`, row, layout.columnSources.track_id);
          ok = false;
        }
      } else if (action > 0) {
        const v = parseNumberBytes(b, fs, fe, this.decimalComma);
        if (status !== 0) {
          const name = STANDARD_COLUMNS[action];
          const colName = layout.columnSources[name] ?? name;
          if (status === 2) {
            issues.add('not-a-number', () => `${rowLabel(row)}: the value '${textOf(b, fs, fe)}' in column ${colName} is not a number.`, row, colName);
            ok = false;
          } else if (name === 'frame' || name === 't') {
            issues.add('missing-value', () => `${rowLabel(row)}: the ${name === 't' ? 'time' : 'frame number'} (column ${colName}) is empty or not finite.`, row, colName);
            ok = false;
          } else {
            issues.add('non-finite', () => `${rowLabel(row)}: column ${colName} is empty or not a finite number ('${textOf(b, fs, fe)}'); the value is treated as missing.`, row, colName);
          }
        }
        cols[action - 1][k] = v;
      }
      field++;
      if (fe >= e) break;
      i = fe + 1;
      if (spaces) {
        while (i < e && b[i] === 32) i++;
        if (i >= e) break;
      }
      fs = i;
    }
    if (field < this.maxNeeded) {
      const missingCol = STANDARD_COLUMNS.filter((n) => (layout.columns[n] ?? -1) >= field).map((n) => layout.columnSources[n] ?? n);
      issues.add(
        'missing-value',
        () => `${rowLabel(row)}: the row has ${field} value${field === 1 ? '' : 's'} but ${layout.fieldCount} are expected; ${missingCol.join(', ')} ${missingCol.length === 1 ? 'is' : 'are'} missing.`,
        row,
      );
      return;
    }
    if (field !== layout.fieldCount && !(field === layout.fieldCount + 1 && b[e - 1] === delim))
      issues.add('field-count', () => `${rowLabel(row)}: the row has ${field} values but the header has ${layout.fieldCount} columns; the extra or missing values are not used.`, row);
    if (!ok) return;
    this.dataRows++;
    this.batch.track[k] = track;
    this.batch.line[k] = row;
    this.batch.count = k + 1;
  }
}

function count(text: string, ch: string): number {
  let n = 0;
  for (let i = 0; i < text.length; i++) if (text[i] === ch) n++;
  return n;
}

function concat(a: Uint8Array, b: Uint8Array): Uint8Array {
  const out = new Uint8Array(a.length + b.length);
  out.set(a, 0);
  out.set(b, a.length);
  return out;
}

/** What {@link parseDataBlock} needs of the file's layout (plain data, sent to a worker). */
export interface BlockLayout {
  delimiter: number;
  decimalComma: boolean;
  fieldCount: number;
  /** Per field: −1 unused, 0 track id, k > 0 numeric column NUMERIC[k − 1]. */
  actions: Int8Array;
  /** Numeric columns present (names of NUMERIC), in order. */
  columns: string[];
  /** Per field: index into `columns`, or −1. */
  columnIndex: Int32Array;
}

/** Rows of a block parsed by {@link parseDataBlock}: raw integer track ids and one column per mapped value. */
export interface ParsedBlock {
  count: number;
  trackIds: Int32Array;
  values: Partial<Record<Exclude<StandardColumn, 'track_id'>, Float64Array>>;
}

/**
 * Parses a block of whole lines (bytes [start, end), the last ending in a
 * line break) when every line is a plain data line: unquoted decimals with at
 * most 15 digits and no exponent, a non-negative integer track id below
 * 4,194,304, exactly `fieldCount` fields, no blank or comment line. Returns
 * null otherwise (the caller parses the block with {@link DelimitedTextParser},
 * which reports every problem with its row). Values are exactly those of the
 * parser (Clinger's fast path, PLDI 1990). Pure and self-contained (no
 * reference outside its arguments and built-ins): a worker runs its source
 * text (server/ingest/parse-offload.ts), which is why its number scanning
 * repeats the class's fast path instead of calling it. `pool`: spare buffers to write into
 * (taken out of the array; each returned column's `.buffer` may be given back).
 */
export function parseDataBlock(b: Uint8Array, start: number, end: number, layout: BlockLayout, pool?: ArrayBuffer[], exactRows?: number): ParsedBlock | null {
  const { actions, fieldCount } = layout;
  const nActions = actions.length;
  const delim = layout.delimiter;
  const comma = layout.decimalComma ? 44 : -1;
  const pow10 = new Float64Array([1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15]);
  if (fieldCount < 1 || end <= start || b[end - 1] !== 10) return null;
  // Capacity from the mean length of the first 64 lines, +25 % (counting every line break costs a call per line);
  // if the block holds more lines, it is parsed again with the exact count (exactRows).
  let cap = exactRows ?? 0;
  if (exactRows === undefined) {
    let p = start - 1, n = 0;
    while (n < 64 && (p = b.indexOf(10, p + 1)) >= 0 && p < end) n++;
    cap = n < 64 ? n + 1 : Math.ceil(((end - start) / (p + 1 - start)) * 64 * 1.25) + 64;
  }
  // Output buffers come from `pool` when one is large enough (buffers handed back by the consumer), else are new.
  const take = (): ArrayBuffer => {
    if (pool) for (let j = pool.length - 1; j >= 0; j--) if (pool[j].byteLength >= 8 * cap) return pool.splice(j, 1)[0];
    return new ArrayBuffer(8 * cap);
  };
  const trackIds = new Int32Array(take(), 0, cap);
  const cols = layout.columns.map(() => new Float64Array(take(), 0, cap));
  const colOf = layout.columnIndex;
  let k = 0;
  let i = start;
  // Parses the line at i into row k; returns the start of the next line, or −1 (block declined).
  const line = (i: number, k: number): number => {
    let field = 0;
    let track = -1;
    let c = 0;
    // Hot loop: one pass over the bytes of a line, numbers accumulated as they are scanned.
    for (;;) {
      let neg = false;
      if (b[i] === 45) {
        neg = true;
        i++;
      }
      // Digits accumulate two at a time in 32-bit integers while at most 9 are read (a shorter dependency chain
      // than one double multiply-add per digit; ≈ 10 % faster on this file shape), then in a double; exact below
      // 2^53 either way. One decimal separator may interrupt them. The block ends with a line break (checked
      // above), so no bounds check is needed.
      let mant = 0, digits = 0, dotAt = -1;
      let d = b[i] - 48;
      for (;;) {
        while (digits <= 7 && d >= 0 && d <= 9) {
          const e = b[i + 1] - 48;
          if (e < 0 || e > 9) {
            mant = (mant * 10 + d) | 0;
            digits++;
            d = e;
            i++;
            break;
          }
          mant = (mant * 100 + d * 10 + e) | 0;
          digits += 2;
          i += 2;
          d = b[i] - 48;
        }
        for (; d >= 0 && d <= 9; d = b[++i] - 48) {
          mant = mant * 10 + d;
          digits++;
        }
        c = b[i];
        if ((c === 46 || c === comma) && dotAt < 0) {
          dotAt = digits;
          d = b[++i] - 48;
          continue;
        }
        break;
      }
      const frac = dotAt < 0 ? 0 : digits - dotAt;
      if (digits === 0 || digits > 15) return -1;
      const action = field < nActions ? actions[field] : -1;
      if (action === 0) {
        if (neg || frac > 0 || mant >= 4194304) return -1;
        track = mant;
      } else if (action > 0) {
        const v = frac === 0 ? mant : mant / pow10[frac];
        cols[colOf[field]][k] = neg ? -v : v;
      }
      field++;
      if (c === delim) {
        i++;
        continue;
      }
      break;
    }
    if (c === 10) i++;
    else if (c === 13 && i + 1 < end && b[i + 1] === 10) i += 2;
    else return -1;
    if (field !== fieldCount || track < 0) return -1;
    trackIds[k] = track;
    return i;
  };
  while (i < end) {
    if (k < cap) i = line(i, k);
    if (k === cap || i < 0) {
      if (pool) pool.push(trackIds.buffer, ...cols.map((c) => c.buffer));
      if (i < 0 || exactRows !== undefined) return null;
      let lines = 0;
      for (let p = b.indexOf(10, start); p >= 0 && p < end; p = b.indexOf(10, p + 1)) lines++;
      return parseDataBlock(b, start, end, layout, pool, lines);
    }
    k++;
  }
  const values: ParsedBlock['values'] = {};
  layout.columns.forEach((name, j) => {
    values[name as Exclude<StandardColumn, 'track_id'>] = cols[j].subarray(0, k);
  });
  return { count: k, trackIds: trackIds.subarray(0, k), values };
}
