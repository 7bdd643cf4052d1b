/**
 * Imports a text capture: sniff the head, stream the rest through the typed-array parser, map channels, check
 * the columns, and hand back decoded channels with the warnings found on the way.
 */
import { CaptureError } from '../errors';
import { type QualityWarning, warning } from '../steps/warnings';
import type { CaptureColumns } from '../types';
import { checkTime, checkValues, fillMissing } from './check-columns';
import { parseNumberField } from './header';
import { type ChannelMapping, type ChannelRole, mapChannels, mappingConfidence } from './map-channels';
import { NumberParser } from './parse-numbers';
import { SNIFF_BYTES, type SniffResult, sniffCapture } from './sniff';

export const MAX_CAPTURE_BYTES = 256 * 1024 * 1024;

export interface ImportOptions {
  /** Roles per column, overriding the automatic mapping. */
  mapping?: ChannelRole[];
  /** Samples per second, for a time column that counts samples. */
  sampleRateHz?: number;
}

export interface ChannelInfo {
  index: number;
  role: ChannelRole;
  name: string;
  unit: string | null;
  confidence: number;
}

export interface ImportedCapture {
  columns: CaptureColumns;
  channels: ChannelInfo[];
  /** Lowest confidence of the automatic mapping (1 when the mapping was given). */
  confidence: number;
  sniff: SniffResult;
  rows: number;
  warnings: QualityWarning[];
}

/** Streaming importer: push the file's bytes from the start in chunks, then finish. */
export class CaptureImporter {
  readonly sniff: SniffResult;
  private readonly mapping: ChannelMapping;
  private readonly parser: NumberParser;
  private readonly options: ImportOptions;
  private skip: number;
  private readonly given: boolean;

  /** `head` is the file's first bytes (at least 64 KB or the whole file); `size` its length in bytes. */
  constructor(head: Uint8Array, size: number, options: ImportOptions = {}) {
    if (size > MAX_CAPTURE_BYTES) {
      throw new CaptureError('TOO_LARGE', `The file is ${(size / 1048576).toFixed(0)} MB; captures up to 256 MB are accepted. Export a shorter window around the cranking.`);
    }
    this.options = options;
    this.sniff = sniffCapture(head.subarray(0, Math.min(head.length, SNIFF_BYTES + 1)));
    const width = this.sniff.columns.length;
    const preview = Array.from({ length: width }, (_, c) =>
      Float64Array.from(this.sniff.preview.map((r) => parseNumberField(r[c] ?? '', this.sniff.decimalComma))),
    );
    const auto = mapChannels(this.sniff.columns, preview);
    this.given = !!options.mapping;
    if (options.mapping) {
      if (options.mapping.length !== width) {
        throw new CaptureError('BAD_MAPPING', `The mapping names ${options.mapping.length} columns but the file has ${width}.`);
      }
      auto.roles = options.mapping;
    }
    this.mapping = auto;
    const sample = head.subarray(this.sniff.dataOffset, Math.min(head.length, SNIFF_BYTES));
    let newlines = 0;
    for (let i = 0; i < sample.length; i++) if (sample[i] === 10) newlines++;
    const bytesPerRow = Math.max(8, sample.length / Math.max(1, newlines));
    this.parser = new NumberParser({
      delimiter: this.sniff.delimiter,
      decimalComma: this.sniff.decimalComma,
      width,
      rowsHint: Math.ceil((size - this.sniff.dataOffset) / bytesPerRow) + 16,
      firstLine: this.sniff.firstDataLine + 1,
    });
    this.skip = this.sniff.dataOffset;
  }

  push(chunk: Uint8Array): void {
    if (this.skip > 0) {
      if (chunk.length <= this.skip) {
        this.skip -= chunk.length;
        return;
      }
      chunk = chunk.subarray(this.skip);
      this.skip = 0;
    }
    this.parser.push(chunk);
  }

  finish(): ImportedCapture {
    const parsed = this.parser.finish();
    const s = this.sniff;
    const warnings: QualityWarning[] = [];
    const firstLine = s.firstDataLine + 1;
    if (parsed.rows === 0) throw new CaptureError('NO_NUMERIC_DATA', 'The file holds a header but no rows of numbers; export the capture again.');
    if (parsed.firstBadField && parsed.badFields > Math.max(2, parsed.rows * 0.01)) {
      const b = parsed.firstBadField;
      throw new CaptureError(
        'BAD_NUMBER',
        `Line ${b.line}, column ${b.column} holds "${b.text}", not a number, and ${parsed.badFields} rows are like it; check the delimiter and decimal mark, or export the capture again.`,
        { line: b.line, column: b.column },
      );
    }
    if (parsed.badFields > 0 && parsed.firstBadField) {
      warnings.push(warning('MISSING_VALUES', `${parsed.badFields} row(s) hold text where a number belongs (first at line ${parsed.firstBadField.line}); they are treated as missing.`));
    }
    if (parsed.truncatedLastLine) warnings.push(warning('MISSING_VALUES', 'The last line is cut off (the file ends mid-line); it was left out.'));
    if (parsed.raggedRows > 0) {
      warnings.push(warning('MISSING_VALUES', `${parsed.raggedRows} row(s) have the wrong number of fields (first at line ${parsed.firstRaggedLine}); their missing fields are treated as missing.`));
    }

    const roles = this.mapping.roles;
    const columns: CaptureColumns = {};
    const channels: ChannelInfo[] = [];
    for (let c = 0; c < roles.length; c++) {
      const role = roles[c];
      channels.push({ index: c, role, name: s.columns[c].name, unit: s.columns[c].unit, confidence: this.given ? 1 : this.mapping.confidence[c] });
      if (role === 'ignore') continue;
      const v = parsed.columns[c];
      if (role === 'time' || role === 'toothTimes') {
        if (role === 'time' && this.mapping.timeIsIndex) {
          const rate = this.options.sampleRateHz;
          if (!rate || !(rate > 0)) {
            throw new CaptureError('BAD_MAPPING', `Column ${c + 1} ("${s.columns[c].name}") counts samples rather than time; enter the sample rate the capture was recorded at.`, { column: c + 1 });
          }
          for (let i = 0; i < v.length; i++) v[i] = v[i] / rate;
        } else if (this.mapping.timeScale !== 1) {
          const k = this.mapping.timeScale;
          for (let i = 0; i < v.length; i++) v[i] *= k;
        }
        warnings.push(...checkTime(v, firstLine));
        if (parsed.missingValues > 0) fillMissing(v);
      } else {
        const missing = parsed.missingValues > 0 ? fillMissing(v) : 0;
        warnings.push(...checkValues(`${s.columns[c].name}`, v, role === 'current' || role === 'rpm', missing));
      }
      columns[role] = v;
    }
    if (roles.length === 1 && roles[0] !== 'toothTimes') {
      throw new CaptureError('ONE_COLUMN', 'The file has a single column that is not a list of tooth times; export the time column together with the channels.', { column: 1 });
    }
    if (columns.toothTimes && roles.length === 1 && warnings.some((w) => w.code === 'TIME_NOT_MONOTONIC')) {
      throw new CaptureError('ONE_COLUMN', 'The single column is not a rising list of tooth times; export the time column together with the channels.', { column: 1 });
    }
    return { columns, channels, confidence: this.given ? 1 : mappingConfidence(this.mapping), sniff: s, rows: parsed.rows, warnings: dedupe(warnings) };
  }
}

/** Imports a whole file held in memory, in 1 MB chunks. */
export function importCapture(bytes: Uint8Array, options: ImportOptions = {}, onProgress?: (fraction: number) => void): ImportedCapture {
  const importer = new CaptureImporter(bytes.subarray(0, SNIFF_BYTES + 1), bytes.length, options);
  const step = 1 << 20;
  for (let o = 0; o < bytes.length; o += step) {
    importer.push(bytes.subarray(o, Math.min(bytes.length, o + step)));
    onProgress?.(Math.min(1, (o + step) / bytes.length));
  }
  return importer.finish();
}

function dedupe(w: QualityWarning[]): QualityWarning[] {
  const seen = new Set<string>();
  return w.filter((x) => (seen.has(x.message) ? false : (seen.add(x.message), true)));
}
