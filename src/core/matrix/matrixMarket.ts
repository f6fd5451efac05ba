/**
 * Matrix Market exchange format, text only (Boisvert, Pozo & Remington, "The Matrix Market
 * Exchange Formats: Initial Design", NIST IR 5935, 1996): a banner line
 * `%%MatrixMarket matrix <coordinate|array> <real|integer|pattern> <general|symmetric|skew-symmetric>`,
 * comment lines starting with '%', a size line ("M N NNZ" for coordinate, "M N" for array), then
 * the entries: "i j value" with 1-based indices for coordinate, one value per line in column-major
 * order for array. Complex and Hermitian matrices are refused.
 *
 * Writers yield text in chunks so the caller can stream very large matrices to a file; the
 * parser takes chunks too. Numbers are written in JavaScript's shortest round-trip form, so
 * reading them back gives the same doubles.
 */
import { InvalidInputError } from '../errors.js';
import type { CsrMatrix } from './sparse.js';

export type MmFormat = 'coordinate' | 'array';
export type MmField = 'real' | 'integer' | 'pattern';
export type MmSymmetry = 'general' | 'symmetric' | 'skew-symmetric';

/** A parsed matrix: coordinate entries (0-based, symmetric halves expanded) or a dense array. */
export type MatrixMarketData =
  | {
      readonly format: 'coordinate';
      readonly rows: number;
      readonly cols: number;
      readonly rowIndex: Int32Array;
      readonly colIndex: Int32Array;
      readonly values: Float64Array;
    }
  | { readonly format: 'array'; readonly rows: number; readonly cols: number; /** Row-major. */ readonly data: Float64Array };

const CHUNK_LINES = 4096;

function banner(format: MmFormat, comments: readonly string[]): string {
  const lines = [`%%MatrixMarket matrix ${format} real general`, ...comments.map((c) => `% ${c.replace(/[\r\n]+/g, ' ')}`)];
  return `${lines.join('\n')}\n`;
}

/**
 * A CSR matrix in coordinate format. With transpose, entry (i, j) of m is written as (j, i), so a
 * document-major matrix comes out as the usual term × document matrix.
 */
export function* coordinateChunks(m: CsrMatrix, options: { transpose?: boolean; comments?: readonly string[] } = {}): Generator<string> {
  const t = options.transpose ?? false;
  const nnz = m.indptr[m.rows];
  yield `${banner('coordinate', options.comments ?? [])}${t ? m.cols : m.rows} ${t ? m.rows : m.cols} ${nnz}\n`;
  let buf: string[] = [];
  for (let i = 0; i < m.rows; i++) {
    for (let p = m.indptr[i]; p < m.indptr[i + 1]; p++) {
      const a = i + 1;
      const b = m.indices[p] + 1;
      buf.push(t ? `${b} ${a} ${m.values[p]}` : `${a} ${b} ${m.values[p]}`);
      if (buf.length >= CHUNK_LINES) {
        yield `${buf.join('\n')}\n`;
        buf = [];
      }
    }
  }
  if (buf.length > 0) yield `${buf.join('\n')}\n`;
}

/** A dense row-major rows × cols matrix in array format (values column by column). */
export function* arrayChunks(rows: number, cols: number, data: ArrayLike<number>, comments: readonly string[] = []): Generator<string> {
  if (data.length !== rows * cols) throw new InvalidInputError(`a ${rows}×${cols} matrix needs ${rows * cols} numbers, got ${data.length}`);
  yield `${banner('array', comments)}${rows} ${cols}\n`;
  let buf: string[] = [];
  for (let j = 0; j < cols; j++) {
    for (let i = 0; i < rows; i++) {
      buf.push(String(data[i * cols + j]));
      if (buf.length >= CHUNK_LINES) {
        yield `${buf.join('\n')}\n`;
        buf = [];
      }
    }
  }
  if (buf.length > 0) yield `${buf.join('\n')}\n`;
}

/** Incremental reader: push() text chunks in order, then end(). */
export class MatrixMarketParser {
  private carry = '';
  private lineNo = 0;
  private header?: { format: MmFormat; field: MmField; symmetry: MmSymmetry };
  private size?: { rows: number; cols: number; entries: number };
  private count = 0;
  private rowIdx: Int32Array = new Int32Array(0);
  private colIdx: Int32Array = new Int32Array(0);
  private vals: Float64Array = new Float64Array(0);

  constructor(private readonly name = 'matrix') {}

  push(chunk: string): void {
    const text = this.carry + chunk;
    let start = 0;
    for (;;) {
      const nl = text.indexOf('\n', start);
      if (nl < 0) break;
      this.line(text.slice(start, nl));
      start = nl + 1;
    }
    this.carry = text.slice(start);
  }

  end(): MatrixMarketData {
    if (this.carry.length > 0) this.line(this.carry);
    this.carry = '';
    if (!this.header || !this.size) throw this.error('is not a complete Matrix Market file (banner or size line missing)');
    const { rows, cols, entries } = this.size;
    if (this.count !== entries) throw this.error(`declares ${entries} entries but holds ${this.count}`);
    if (this.header.format === 'array') {
      const data = new Float64Array(rows * cols);
      // Column-major values; symmetric arrays list the lower triangle only.
      let t = 0;
      for (let j = 0; j < cols; j++) {
        const first = this.header.symmetry === 'general' ? 0 : this.header.symmetry === 'symmetric' ? j : j + 1;
        for (let i = first; i < rows; i++) {
          const v = this.vals[t++];
          data[i * cols + j] = v;
          if (this.header.symmetry !== 'general' && i !== j) data[j * cols + i] = this.header.symmetry === 'symmetric' ? v : -v;
        }
      }
      return { format: 'array', rows, cols, data };
    }
    return this.coordinateResult(rows, cols);
  }

  private coordinateResult(rows: number, cols: number): MatrixMarketData {
    const sym = this.header!.symmetry;
    const n = this.count;
    if (sym === 'general')
      return {
        format: 'coordinate',
        rows,
        cols,
        rowIndex: this.rowIdx.slice(0, n),
        colIndex: this.colIdx.slice(0, n),
        values: this.vals.slice(0, n),
      };
    const r: number[] = [],
      c: number[] = [],
      v: number[] = [];
    for (let t = 0; t < n; t++) {
      r.push(this.rowIdx[t]);
      c.push(this.colIdx[t]);
      v.push(this.vals[t]);
      if (this.rowIdx[t] !== this.colIdx[t]) {
        r.push(this.colIdx[t]);
        c.push(this.rowIdx[t]);
        v.push(sym === 'symmetric' ? this.vals[t] : -this.vals[t]);
      }
    }
    return { format: 'coordinate', rows, cols, rowIndex: Int32Array.from(r), colIndex: Int32Array.from(c), values: Float64Array.from(v) };
  }

  private line(raw: string): void {
    this.lineNo++;
    const line = raw.trim();
    if (!this.header) return this.parseBanner(line);
    if (line.length === 0 || line.startsWith('%')) return;
    const parts = line.split(/\s+/);
    if (!this.size) return this.parseSize(parts);
    const h = this.header;
    if (this.count >= this.size.entries)
      throw this.error(`has more entries than the ${this.size.entries} it declares (line ${this.lineNo})`);
    const t = this.count++;
    if (h.format === 'array') {
      this.vals[t] = this.number(parts[0]);
      return;
    }
    const i = this.index(parts[0], this.size.rows);
    const j = this.index(parts[1], this.size.cols);
    this.rowIdx[t] = i;
    this.colIdx[t] = j;
    this.vals[t] = h.field === 'pattern' ? 1 : this.number(parts[2]);
  }

  private parseBanner(line: string): void {
    const m = /^%%MatrixMarket\s+matrix\s+(\S+)\s+(\S+)\s+(\S+)\s*$/i.exec(line);
    if (!m) throw this.error('does not start with a "%%MatrixMarket matrix …" banner');
    const [format, field, symmetry] = [m[1].toLowerCase(), m[2].toLowerCase(), m[3].toLowerCase()];
    if (format !== 'coordinate' && format !== 'array') throw this.error(`has unknown format "${format}"`);
    if (field === 'complex' || symmetry === 'hermitian') throw this.error('is complex; only real matrices are supported');
    const f = field === 'double' ? 'real' : field;
    if (f !== 'real' && f !== 'integer' && f !== 'pattern') throw this.error(`has unknown field "${field}"`);
    if (f === 'pattern' && format === 'array') throw this.error('is a pattern matrix in array format, which the format does not allow');
    if (symmetry !== 'general' && symmetry !== 'symmetric' && symmetry !== 'skew-symmetric')
      throw this.error(`has unknown symmetry "${symmetry}"`);
    this.header = { format, field: f, symmetry };
  }

  private parseSize(parts: string[]): void {
    const nums = parts.map((p) => Number(p));
    const isArray = this.header!.format === 'array';
    if (nums.length !== (isArray ? 2 : 3) || nums.some((n) => !Number.isInteger(n) || n < 0))
      throw this.error(`has a bad size line (line ${this.lineNo})`);
    const [rows, cols] = nums;
    const sym = this.header!.symmetry !== 'general';
    if (sym && rows !== cols) throw this.error('is declared symmetric but is not square');
    const skew = this.header!.symmetry === 'skew-symmetric';
    const entries = isArray ? (sym ? (rows * (skew ? rows - 1 : rows + 1)) / 2 : rows * cols) : nums[2];
    this.size = { rows, cols, entries };
    this.vals = new Float64Array(entries);
    if (!isArray) {
      this.rowIdx = new Int32Array(entries);
      this.colIdx = new Int32Array(entries);
    }
  }

  private number(s: string | undefined): number {
    const v = Number(s);
    if (s === undefined || s === '' || !Number.isFinite(v))
      throw this.error(`has a value that is not a finite number on line ${this.lineNo}`);
    return v;
  }

  private index(s: string | undefined, limit: number): number {
    const v = Number(s);
    if (!Number.isInteger(v) || v < 1 || v > limit) throw this.error(`has an index out of range on line ${this.lineNo}`);
    return v - 1;
  }

  private error(what: string): InvalidInputError {
    return new InvalidInputError(`${this.name} ${what}`);
  }
}

/** Parses a whole Matrix Market text at once. */
export function parseMatrixMarket(text: string, name?: string): MatrixMarketData {
  const p = new MatrixMarketParser(name);
  p.push(text);
  return p.end();
}

/** A parsed matrix as a dense row-major array (coordinate entries summed into place). */
export function toDense(m: MatrixMarketData): Float64Array {
  if (m.format === 'array') return m.data;
  const d = new Float64Array(m.rows * m.cols);
  for (let t = 0; t < m.values.length; t++) d[m.rowIndex[t] * m.cols + m.colIndex[t]] += m.values[t];
  return d;
}
