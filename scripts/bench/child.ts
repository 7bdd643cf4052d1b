/**
 * One measurement in a fresh process, so peak memory belongs to it alone: `baseline` (read the bytes in 1 MB
 * pieces and a minimal float parse), `import` (the streaming importer, then the analysis), or `papaparse` /
 * `csv-parse` (the whole file parsed to numbers by each package, into the same Float64Array columns).
 * Prints one JSON line.
 */
import { closeSync, openSync, readFileSync, readSync, statSync } from 'node:fs';
import { parse as csvParse } from 'csv-parse/sync';
import Papa from 'papaparse';
import { analyzeCapture, CaptureImporter } from '../../signal';

const [mode, path] = process.argv.slice(2);
const CHUNK = 1 << 20;

function readChunks(onChunk: (b: Uint8Array) => void): number {
  const fd = openSync(path, 'r');
  const buf = new Uint8Array(CHUNK);
  let total = 0;
  for (;;) {
    const n = readSync(fd, buf, 0, CHUNK, null);
    if (n <= 0) break;
    onChunk(buf.subarray(0, n));
    total += n;
  }
  closeSync(fd);
  return total;
}

/** The simplest correct-enough float parse: digits, one decimal point, commas and newlines. */
function baseline(): number {
  const size = statSync(path).size;
  const out = new Float64Array(Math.ceil(size / 4));
  let n = 0;
  let mant = 0;
  let scale = 1;
  let frac = false;
  let neg = false;
  let header = true;
  readChunks((b) => {
    for (let i = 0; i < b.length; i++) {
      const c = b[i];
      if (header) {
        if (c === 10) header = false;
        continue;
      }
      if (c >= 48 && c <= 57) {
        mant = mant * 10 + (c - 48);
        if (frac) scale *= 10;
      } else if (c === 46) frac = true;
      else if (c === 45) neg = true;
      else if (c === 44 || c === 10) {
        out[n++] = (neg ? -mant : mant) / scale;
        mant = 0;
        scale = 1;
        frac = false;
        neg = false;
      }
    }
  });
  return n;
}

/** Rows of numbers (header dropped) into one Float64Array per column, as the importer keeps them. */
function toColumns(rows: unknown[][]): number {
  const width = rows[0].length;
  const cols = Array.from({ length: width }, () => new Float64Array(rows.length));
  for (let r = 0; r < rows.length; r++) for (let c = 0; c < width; c++) cols[c][r] = Number(rows[r][c]);
  return rows.length * width;
}

const before = process.memoryUsage().rss;
const t0 = performance.now();
if (mode === 'papaparse' || mode === 'csv-parse') {
  const text = readFileSync(path, 'utf8');
  const rows =
    mode === 'papaparse'
      ? Papa.parse<unknown[]>(text, { dynamicTyping: true, skipEmptyLines: true, fastMode: true }).data.slice(1)
      : (csvParse(text, { cast: true, fromLine: 2, skipEmptyLines: true }) as unknown[][]);
  const values = toColumns(rows);
  console.log(JSON.stringify({ ms: performance.now() - t0, values, peakBytes: process.resourceUsage().maxRSS * 1024 - before }));
} else if (mode === 'baseline') {
  const values = baseline();
  const ms = performance.now() - t0;
  console.log(JSON.stringify({ ms, values }));
} else {
  const size = statSync(path).size;
  const headBuf = new Uint8Array(CHUNK);
  const fd = openSync(path, 'r');
  const headLen = readSync(fd, headBuf, 0, CHUNK, 0);
  closeSync(fd);
  const importer = new CaptureImporter(headBuf.subarray(0, headLen), size);
  readChunks((b) => importer.push(b));
  const capture = importer.finish();
  const importMs = performance.now() - t0;
  const t1 = performance.now();
  const result = analyzeCapture(capture.columns, { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } }, capture.warnings);
  const analysisMs = performance.now() - t1;
  const peak = process.resourceUsage().maxRSS * 1024;
  const columnBytes = capture.rows * capture.channels.length * 8;
  console.log(JSON.stringify({ importMs, analysisMs, peakBytes: peak - before, columnBytes, rows: capture.rows, low: result.cylinders.filter((c) => c.status === 'low').map((c) => c.cylinder) }));
}
