// Capture import: delimiters, decimal comma, free text before the header, units, and the typed errors.
import { describe, expect, it } from 'vitest';
import { CaptureError } from '@/signal/errors';
import { importCapture } from '@/signal/import/import-capture';
import { NumberParser } from '@/signal/import/parse-numbers';

const enc = (s: string) => new TextEncoder().encode(s);

function rows(n: number, f: (i: number) => string) {
  return Array.from({ length: n }, (_, i) => f(i)).join('\n') + '\n';
}

describe('import', () => {
  it('reads comma CSV with a header in ms and units in brackets and parentheses', () => {
    const text = 'Time (ms),Starter current [A],Cyl 1 sync [V]\n' + rows(50, (i) => `${i * 0.1},${100 + i},${i % 10 === 0 ? 5 : 0}`);
    const c = importCapture(enc(text));
    expect(c.channels.map((x) => x.role)).toEqual(['time', 'current', 'sync']);
    expect(c.columns.time![10]).toBeCloseTo(0.001, 12);
    expect(c.columns.current![49]).toBe(149);
    expect(c.confidence).toBeGreaterThanOrEqual(0.7);
  });

  it('skips free-text lines, reads ; with the decimal comma and time in s', () => {
    const text = 'Logger export\nBay 2, cart A\n\nTime (s);current (A)\n' + rows(30, (i) => `${(i / 1000).toFixed(3).replace('.', ',')};${(120.5 + i).toFixed(1).replace('.', ',')}`);
    const c = importCapture(enc(text));
    expect(c.sniff.delimiter).toBe(';');
    expect(c.sniff.decimalComma).toBe(true);
    expect(c.sniff.preamble).toEqual(['Logger export', 'Bay 2, cart A']);
    expect(c.columns.time![5]).toBeCloseTo(0.005, 12);
    expect(c.columns.current![2]).toBeCloseTo(122.5, 12);
  });

  it('reads tab-separated µs time', () => {
    const text = 'Time (µs)\tAmps [A]\n' + rows(20, (i) => `${i * 100}\t${i}`);
    const c = importCapture(enc(text));
    expect(c.sniff.delimiter).toBe('\t');
    expect(c.columns.time![3]).toBeCloseTo(300e-6, 15);
  });

  it('a sample index needs a sample rate, and uses it', () => {
    const text = 'Sample,current [A]\n' + rows(20, (i) => `${i},${i * 2}`);
    expect(() => importCapture(enc(text))).toThrow(/sample rate/);
    const c = importCapture(enc(text), { sampleRateHz: 1000 });
    expect(c.columns.time![7]).toBeCloseTo(0.007, 12);
  });

  it('one column of rising times is tooth times; one column that is not is refused', () => {
    const c = importCapture(enc('Tooth edge time (s)\n' + rows(30, (i) => `${(i * 0.003).toFixed(4)}`)));
    expect(c.channels[0].role).toBe('toothTimes');
    expect(() => importCapture(enc('value\n' + rows(30, (i) => `${(i * 37) % 11}`)))).toThrow(CaptureError);
  });

  it('accepts an explicit mapping', () => {
    const text = 'a,b,c\n' + rows(20, (i) => `${i / 1000},${i},${i % 2}`);
    const c = importCapture(enc(text), { mapping: ['time', 'ignore', 'current'] });
    expect(c.columns.current![3]).toBe(1);
    expect(c.columns.sync).toBeUndefined();
  });

  it.each([
    ['an empty file', '', 'EMPTY_FILE'],
    ['binary bytes', '\u0000\u0001\u0002PK\u0003', 'NOT_TEXT'],
    ['words only', 'this is a note\nabout a car\n', 'NO_NUMERIC_DATA'],
  ])('%s is a typed error', (_l, text, code) => {
    try {
      importCapture(enc(text));
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(CaptureError);
      expect((e as CaptureError).code).toBe(code);
    }
  });

  it('UTF-16 is refused with a sentence saying how to export', () => {
    const bytes = new Uint8Array([0xff, 0xfe, 0x54, 0x00, 0x69, 0x00]);
    expect(() => importCapture(bytes)).toThrow(/UTF-16/);
  });

  it('names the line and column of text where numbers belong', () => {
    const text = 'Time (s),current [A]\n' + rows(20, (i) => `${i / 1000},${i}`) + rows(20, (i) => `${(20 + i) / 1000},oops`);
    try {
      importCapture(enc(text));
      expect.unreachable();
    } catch (e) {
      expect((e as CaptureError).code).toBe('BAD_NUMBER');
      expect((e as CaptureError).line).toBe(22);
      expect((e as CaptureError).column).toBe(2);
    }
  });

  it('a file cut mid-line keeps the complete rows and says so', () => {
    const text = 'Time (s),current [A]\n' + rows(20, (i) => `${i / 1000},${i}`) + '0.021,';
    const c = importCapture(enc(text));
    expect(c.rows).toBe(20);
    expect(c.warnings.some((w) => /cut off/.test(w.message))).toBe(true);
  });

  it('time going backwards is reported with its line', () => {
    const text = 'Time (s),current [A]\n' + rows(20, (i) => `${(i === 10 ? 2 : i) / 1000},${i}`);
    const c = importCapture(enc(text));
    const w = c.warnings.find((x) => x.code === 'TIME_NOT_MONOTONIC');
    expect(w?.message).toMatch(/line 12/);
  });

  it('flags a flat-topped current as clipped', () => {
    const text = 'Time (s),current [A]\n' + rows(2000, (i) => `${i / 1000},${Math.min(200, 150 + 80 * Math.sin(i / 20)).toFixed(1)}`);
    expect(importCapture(enc(text)).warnings.map((w) => w.code)).toContain('CLIPPED_SIGNAL');
  });
});

describe('the streaming number parser converts exactly like Number() (ECMAScript Number parsing)', () => {
  it('over many decimal forms, split across chunks at every position', () => {
    const values = ['0', '-0.5', '12.345', '1e3', '-2.5E-4', '123456789012345678', '0.1', '3.14159265358979', '.5', '7.', '+4.25', '1e-300', '1e308'];
    const text = values.map((v) => `${v},${v}`).join('\n') + '\n';
    const bytes = enc(text);
    for (let cut = 1; cut < bytes.length; cut += 3) {
      const p = new NumberParser({ delimiter: ',', decimalComma: false, width: 2 });
      p.push(bytes.subarray(0, cut));
      p.push(bytes.subarray(cut));
      const out = p.finish();
      expect(Array.from(out.columns[0])).toEqual(values.map(Number));
    }
  });

  it('random decimals round-trip', () => {
    let s = 42;
    const rnd = () => ((s = (s * 16807) % 2147483647) / 2147483647);
    const values = Array.from({ length: 2000 }, () => ((rnd() - 0.5) * 10 ** Math.floor(rnd() * 8)).toFixed(Math.floor(rnd() * 7)));
    const p = new NumberParser({ delimiter: ';', decimalComma: true, width: 1 });
    p.push(enc(values.map((v) => v.replace('.', ',')).join('\n') + '\n'));
    expect(Array.from(p.finish().columns[0])).toEqual(values.map(Number));
  });
});

describe('line ends', () => {
  it('a file whose lines end in a lone CR reads like one ending in LF, in any chunking', () => {
    const lf = 'Time (ms),Starter current [A]\n0.0,12.5\n0.2,13.1\n0.4,12.9\n0.6,13.4\n';
    const a = importCapture(new TextEncoder().encode(lf));
    const b = importCapture(new TextEncoder().encode(lf.replaceAll('\n', '\r')));
    expect(b.rows).toBe(4);
    expect(Array.from(b.columns.current!)).toEqual(Array.from(a.columns.current!));
    expect(Array.from(b.columns.time!)).toEqual(Array.from(a.columns.time!));
  });
});
