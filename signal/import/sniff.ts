/**
 * Sniffs the first 64 KB of a capture: text or not, free-text lines before the header, the delimiter
 * (papaparse's guess over the data block), the decimal comma, the header's names and units, and a preview.
 */
import Papa from 'papaparse';
import { CaptureError } from '../errors';
import { type HeaderCell, NUMBER, parseHeaderCell } from './header';

export const SNIFF_BYTES = 64 * 1024;
/** More columns than this is not a capture (and would cost a column array each). */
export const MAX_COLUMNS = 64;

export interface SniffResult {
  delimiter: string;
  decimalComma: boolean;
  /** 0-based index of the header line, or −1 when there is none. */
  headerLine: number;
  /** 0-based index of the first data line. */
  firstDataLine: number;
  /** Lines of free text before the header. */
  preamble: string[];
  columns: HeaderCell[];
  /** The first rows as text, for a preview table. */
  preview: string[][];
  /** Byte offset of the first data line in the file. */
  dataOffset: number;
  /** The units came from a row of their own under the names. */
  unitsRow: boolean;
  /** Sample rate stated in the lines before the header, Hz. */
  sampleRateHz: number | null;
}

const CANDIDATES = [',', ';', '\t', '|'];

/** Sniffs from the first bytes of a file (up to 64 KB are read). */
export function sniffCapture(head: Uint8Array): SniffResult {
  if (head.length === 0) throw new CaptureError('EMPTY_FILE', 'The file is empty; export the capture again from the scope or logger.');
  if ((head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) {
    throw new CaptureError('NOT_TEXT', 'The file is saved as UTF-16 text; export it again as plain text (ASCII or UTF-8) CSV.', { line: 1 });
  }
  const bytes = head.subarray(0, SNIFF_BYTES);
  let control = 0;
  for (let i = 0; i < bytes.length; i++) {
    const b = bytes[i];
    if (b === 0) throw new CaptureError('NOT_TEXT', 'This is not a text capture (it holds binary data); export the capture as CSV or TSV text.');
    if (b < 9 || (b > 13 && b < 32)) control++;
  }
  if (control > bytes.length * 0.01) throw new CaptureError('NOT_TEXT', 'This is not a text capture (it holds binary data); export the capture as CSV or TSV text.');
  let text = new TextDecoder('utf-8', { fatal: false }).decode(bytes);
  let bomBytes = 0;
  if (text.charCodeAt(0) === 0xfeff) {
    text = text.slice(1);
    bomBytes = 3;
  }
  const allLines = text.split('\n');
  // The last line may be cut by the 64 KB limit; drop it unless the sample is the whole file.
  const lines = head.length > SNIFF_BYTES && allLines.length > 1 ? allLines.slice(0, -1) : allLines;
  const clean = lines.map((l) => l.replace(/\r$/, ''));

  const found = findDataStart(clean);
  if (!found) {
    throw new CaptureError('NO_NUMERIC_DATA', 'No rows of numbers were found in the first 64 KB; check that this is the exported capture and not a report or a screenshot.');
  }
  const { line: firstDataLine } = found;
  const block = clean.slice(firstDataLine, firstDataLine + 200).join('\n');
  const guessed = Papa.parse<string[]>(block, { preview: 50, delimitersToGuess: CANDIDATES });
  let delimiter = found.delimiter;
  if (CANDIDATES.includes(guessed.meta.delimiter) && fieldsAllNumeric(clean[firstDataLine], guessed.meta.delimiter)) {
    const a = clean[firstDataLine].split(guessed.meta.delimiter).length;
    const b = clean[firstDataLine].split(delimiter).length;
    if (a >= b) delimiter = guessed.meta.delimiter;
  }
  const decimalComma = delimiter !== ',' && /\d,\d/.test(block);
  const width = clean[firstDataLine].split(delimiter).length;
  if (width > MAX_COLUMNS) {
    throw new CaptureError('NO_NUMERIC_DATA', `Line ${firstDataLine + 1} has ${width} columns; a capture has a time column and a few channels. Export one value per column and one sample per line.`, { line: firstDataLine + 1 });
  }

  let headerLine = -1;
  let unitsRow = false;
  let columns: HeaderCell[] = Array.from({ length: width }, (_, i) => ({ name: `Column ${i + 1}`, unit: null }));
  if (firstDataLine > 0) {
    const parsed = Papa.parse<string[]>(clean[firstDataLine - 1], { delimiter });
    const cells = parsed.data[0] ?? [];
    if (cells.length === width && !fieldsAllNumeric(clean[firstDataLine - 1], delimiter)) {
      headerLine = firstDataLine - 1;
      columns = cells.map(parseHeaderCell);
      // A units row under the names: `Time,Current,Sync` then `(ms),(A),(V)`.
      const above = firstDataLine >= 2 ? (Papa.parse<string[]>(clean[firstDataLine - 2], { delimiter }).data[0] ?? []) : [];
      if (cells.every(isUnitCell) && above.length === width && !fieldsAllNumeric(clean[firstDataLine - 2], delimiter)) {
        headerLine = firstDataLine - 2;
        columns = above.map((name, i) => ({ name: parseHeaderCell(name).name, unit: unitOf(cells[i]) }));
        unitsRow = true;
      }
    }
  }
  const preamble = clean.slice(0, headerLine >= 0 ? headerLine : firstDataLine).filter((l) => l.trim().length > 0);
  const preview = (Papa.parse<string[]>(clean.slice(firstDataLine, firstDataLine + 10).join('\n'), { delimiter }).data ?? []).filter(
    (r) => r.length > 1 || (r.length === 1 && r[0] !== ''),
  );
  let dataOffset = bomBytes;
  const encoder = new TextEncoder();
  for (let i = 0; i < firstDataLine; i++) dataOffset += encoder.encode(lines[i]).length + 1;
  return { delimiter, decimalComma, headerLine, firstDataLine, preamble, columns, preview, dataOffset, unitsRow, sampleRateHz: rateFromPreamble(preamble) };
}

/** A cell of a units row: empty, a unit in brackets, or a bare unit of a few characters. */
function isUnitCell(raw: string): boolean {
  const t = raw.trim().replace(/^"|"$/g, '').trim();
  return t === '' || /^[[(][^\])]{0,12}[\])]$/.test(t) || /^(s|ms|us|µs|μs|a|ma|v|mv|rpm|hz|%|°c|°f|kpa|bar)$/i.test(t);
}

function unitOf(raw: string): string | null {
  const t = raw.trim().replace(/^"|"$/g, '').trim().replace(/^[[(]\s*|\s*[\])]$/g, '');
  return t === '' ? null : t;
}

/** A sample rate or interval stated before the header ("Sample rate: 10 kHz", "Sample interval = 0.0001 s"). */
export function rateFromPreamble(lines: string[]): number | null {
  for (const line of lines) {
    const rate = /sampl\w*\s*(rate|frequency)\W{0,3}([\d.]+(?:e[+-]?\d+)?)\s*(k|M)?\s*(hz|s\/s|sa\/s|sps)/i.exec(line);
    if (rate) {
      const v = Number(rate[2]) * (rate[3] === 'k' ? 1e3 : rate[3] === 'M' ? 1e6 : 1);
      if (v > 0) return v;
    }
    const step = /(sample\s*interval|time\s*step|x\s*increment|\bdt\b)\W{0,3}([\d.]+(?:e[+-]?\d+)?)\s*(ms|us|µs|μs|ns|s)?\b/i.exec(line);
    if (step) {
      const unit = (step[3] ?? 's').toLowerCase();
      const scale = unit === 'ms' ? 1e-3 : unit === 'ns' ? 1e-9 : unit === 's' ? 1 : 1e-6;
      const dt = Number(step[2]) * scale;
      if (dt > 0) return 1 / dt;
    }
  }
  return null;
}

function fieldsAllNumeric(line: string, delimiter: string): boolean {
  const cells = line.split(delimiter);
  if (cells.length === 0) return false;
  let numeric = 0;
  for (const c of cells) {
    const t = c.trim().replace(/^"|"$/g, '');
    if (NUMBER.test(t)) numeric++;
    else if (t !== '' && !/^nan$/i.test(t)) return false;
  }
  return numeric > 0;
}

/** The first line from which five lines in a row are numeric with the same field count under one delimiter. */
function findDataStart(lines: string[]): { line: number; delimiter: string } | null {
  const limit = Math.min(lines.length, 500);
  for (let i = 0; i < limit; i++) {
    if (lines[i].trim() === '') continue;
    let best: { delimiter: string; width: number } | null = null;
    for (const d of CANDIDATES) {
      if (!fieldsAllNumeric(lines[i], d)) continue;
      const width = lines[i].split(d).length;
      let ok = true;
      const run = Math.min(5, lines.length - i);
      for (let k = 1; k < run && ok; k++) {
        const l = lines[i + k];
        if (l.trim() === '' && i + k === lines.length - 1) break;
        ok = fieldsAllNumeric(l, d) && l.split(d).length === width;
      }
      // With a decimal comma and no other delimiter, "1,5" would look like two fields: prefer wider splits only
      // when they are consistent.
      if (ok && (!best || width > best.width)) best = { delimiter: d, width };
    }
    if (best) return { line: i, delimiter: best.delimiter };
  }
  return null;
}
