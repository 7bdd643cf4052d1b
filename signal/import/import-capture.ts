/**
 * Imports a text capture: sniff the head, stream the rest through the typed-array parser, map channels, check
 * the columns, and hand back decoded channels with the warnings found on the way.
 */
import { CaptureError } from '../errors';
import { dropWarnings, type QualityWarning, warning } from '../warnings';
import type { CaptureColumns } from '../types';
import { checkTime, checkValues, fillMissing } from './check-columns';
import { parseNumberField, timeScale, timeUnitInName } from './header';
import { toothTimesFromPeriods } from './tooth-log';
import { chooseEdgeChannels } from './edge-log';
import { type ChannelMapping, type ChannelRole, mapChannels, mappingConfidence } from './map-channels';
import { NumberParser } from './parse-numbers';
import { SNIFF_BYTES, type SniffResult, sniffCapture } from './sniff';

export const MAX_CAPTURE_BYTES = 256 * 1024 * 1024;
/** The same limit as people read it: "256 MB". */
export const MAX_CAPTURE_SIZE = `${MAX_CAPTURE_BYTES / 1048576} MB`;

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
  /** How the file was read, in plain words (an edge log's crank and mark channels, a units row). */
  notes: string[];
}

/** Streaming importer: push the file's bytes from the start in chunks, then finish. */
export class CaptureImporter {
  readonly sniff: SniffResult;
  private readonly mapping: ChannelMapping;
  private readonly parser: NumberParser;
  private readonly options: ImportOptions;
  private skip: number;
  private readonly given: boolean;
  private readonly crOnly: boolean;

  /** `head` is the file's first bytes (at least 64 KB or the whole file); `size` its length in bytes. */
  constructor(head: Uint8Array, size: number, options: ImportOptions = {}) {
    if (size > MAX_CAPTURE_BYTES) {
      throw new CaptureError('TOO_LARGE', `The file is ${(size / 1048576).toFixed(0)} MB; captures up to ${MAX_CAPTURE_SIZE} are accepted. Export a shorter window around the cranking.`);
    }
    this.options = options;
    // Line ends of a lone CR (old spreadsheet exports) are read as LF, byte for byte, so offsets stay the same.
    this.crOnly = !head.includes(10) && head.includes(13);
    if (this.crOnly) head = crToLf(head);
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
    if (this.crOnly) chunk = crToLf(chunk);
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
    const notes: string[] = [];
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
    const edgeLog = this.mapping.edgeLog || roles.includes('level');
    const levels: { index: number; name: string; values: Float64Array }[] = [];
    let periodColumn: { v: Float64Array; unit: string | null } | undefined;
    // A tooth log's time column is kept raw until the periods are read with it.
    const rawTime = roles.includes('toothPeriod') ? parsed.columns[roles.indexOf('time')] : undefined;
    const rawTimeCopy = rawTime ? Float64Array.from(rawTime) : undefined;
    let overRange = 0;
    for (let c = 0; c < roles.length; c++) {
      const role = roles[c];
      channels.push({ index: c, role, name: s.columns[c].name, unit: s.columns[c].unit, confidence: this.given ? 1 : this.mapping.confidence[c] });
      if (role === 'ignore') continue;
      const v = parsed.columns[c];
      const over = role !== 'time' && role !== 'toothTimes' ? markOverRange(v) : 0;
      overRange += over;
      if (role === 'toothPeriod') {
        periodColumn = { v, unit: s.columns[c].unit ?? timeUnitInName(s.columns[c].name) };
        continue;
      }
      if (role === 'level' || (edgeLog && (role === 'crank' || role === 'sync'))) {
        levels.push({ index: c, name: s.columns[c].name, values: v });
        continue;
      }
      if (role === 'time' || role === 'toothTimes') {
        const unit = s.columns[c].unit;
        if (role === 'time' && unit && timeScale(unit) === null && !this.mapping.timeIsIndex && !this.given) {
          throw new CaptureError('BAD_MAPPING', `Column ${c + 1} ("${s.columns[c].name}") is in "${unit}", which is not a unit of time; export time in s, ms or µs, or name the columns and sample rate in the workspace.`, { column: c + 1 });
        }
        if (role === 'time' && this.mapping.timeIsIndex) {
          const rate = this.options.sampleRateHz ?? s.sampleRateHz ?? undefined;
          if (!rate || !(rate > 0)) {
            throw new CaptureError('BAD_MAPPING', `Column ${c + 1} ("${s.columns[c].name}") counts samples rather than time; enter the sample rate the capture was recorded at.`, { column: c + 1 });
          }
          for (let i = 0; i < v.length; i++) v[i] = v[i] / rate;
        } else if (this.mapping.timeScale !== 1) {
          const k = this.mapping.timeScale;
          for (let i = 0; i < v.length; i++) v[i] *= k;
        }
        // An edge log's rows come at level changes: its time steps are uneven by nature.
        warnings.push(...checkTime(v, firstLine).filter((w) => !(edgeLog && w.code === 'TIME_GAPS')));
        if (parsed.missingValues > 0) fillMissing(v);
      } else {
        const missing = parsed.missingValues > 0 || over > 0 ? fillMissing(v) : 0;
        warnings.push(...checkValues(`${s.columns[c].name}`, v, role === 'current' || role === 'rpm', missing));
      }
      columns[role as Exclude<ChannelRole, 'ignore' | 'level' | 'toothPeriod'>] = v;
    }
    if (s.unitsRow) notes.push('Units were read from the row under the column names.');
    if (!columns.time && !columns.toothTimes && roles.length > 0) {
      const rate = this.options.sampleRateHz ?? s.sampleRateHz;
      if (rate) {
        columns.time = Float64Array.from({ length: parsed.rows }, (_, i) => i / rate);
        notes.push(`No time column: time was built from the ${rate} samples/s stated ${this.options.sampleRateHz ? 'in the settings' : 'above the header'}.`);
      }
    }
    if (overRange > 0) {
      warnings.push(warning('OVER_RANGE', `${overRange} sample(s) hold the scope's over-range value (the signal left the set range); they are treated as missing. Set a larger range and record again if the trace looks cut.`));
    }
    if (edgeLog && columns.time) {
      const forcedCrank = this.given ? roles.indexOf('crank') : -1;
      const forcedMark = this.given ? roles.indexOf('sync') : -1;
      const chosen = chooseEdgeChannels(columns.time, levels, forcedCrank >= 0 ? forcedCrank : undefined, forcedMark >= 0 ? forcedMark : undefined);
      delete columns.crank;
      delete columns.sync;
      if (chosen) {
        columns.toothTimes = chosen.toothTimes;
        if (chosen.marks.length) columns.marks = chosen.marks;
        for (const ch of channels) {
          if (ch.index === chosen.crankIndex) ch.role = 'crank';
          else if (chosen.markIndices.includes(ch.index)) ch.role = 'sync';
          else if (ch.role === 'level') ch.role = 'ignore';
        }
        notes.push(`Read as an edge log: ${chosen.toothTimes.length} ${chosen.crankEdge} edges of "${s.columns[chosen.crankIndex].name}" are the crank teeth${chosen.marks.length ? `; "${chosen.marks[0].channel}" may mark cylinder 1` : ''}.`);
      } else {
        for (const ch of channels) if (ch.role === 'level') ch.role = 'ignore';
      }
    }
    if (periodColumn) {
      const log = toothTimesFromPeriods(periodColumn.v, periodColumn.unit, rawTimeCopy, this.mapping.timeScale);
      columns.toothTimes = log.toothTimes;
      delete columns.time;
      // The marker rows between buffers are expected: not missing values.
      dropWarnings(warnings, (w) => w.code === 'MISSING_VALUES' || w.code === 'TIME_GAPS' || w.code === 'TIME_NOT_MONOTONIC');
      notes.push(...log.notes);
    }
    if (roles.length === 1 && roles[0] !== 'toothTimes' && roles[0] !== 'toothPeriod') {
      throw new CaptureError('ONE_COLUMN', 'The file has a single column that is not a list of tooth times; export the time column together with the channels.', { column: 1 });
    }
    if (columns.toothTimes && roles.length === 1 && warnings.some((w) => w.code === 'TIME_NOT_MONOTONIC')) {
      throw new CaptureError('ONE_COLUMN', 'The single column is not a rising list of tooth times; export the time column together with the channels.', { column: 1 });
    }
    return { columns, channels, confidence: this.given ? 1 : mappingConfidence(this.mapping), sniff: s, rows: parsed.rows, warnings: dedupe(warnings), notes };
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

function crToLf(bytes: Uint8Array): Uint8Array {
  return bytes.map((b) => (b === 13 ? 10 : b));
}

/** Scopes write 9.9E37 (or ±Infinity) when the signal leaves the range: make those samples missing. */
function markOverRange(v: Float64Array): number {
  let n = 0;
  for (let i = 0; i < v.length; i++) {
    const x = v[i];
    if (x >= 1e30 || x <= -1e30) {
      v[i] = NaN;
      n++;
    }
  }
  return n;
}

function dedupe(w: QualityWarning[]): QualityWarning[] {
  const seen = new Set<string>();
  return w.filter((x) => (seen.has(x.message) ? false : (seen.add(x.message), true)));
}
