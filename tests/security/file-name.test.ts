/**
 * File names through headers (RFC 6266 §4.3 and RFC 5987 §3.2: an ASCII `filename` fallback and the exact name,
 * UTF-8 percent-encoded, in `filename*`), read back with the `content-disposition` package's own parser as an
 * independent reader.
 */
import contentDisposition from 'content-disposition';
import { describe, expect, it } from 'vitest';
import { dispositionFor, fileNameFromHeader } from '@/server/file-name';

const NAMES = ['Zündung—bay2.csv', 'Łódź.csv', 'Свеча.csv', '点火テスト.csv', 'crank 🔧.csv', 'say "cheese".csv', 'a;b.csv', '100%.csv', 'plain.csv'];

describe('file names', () => {
  it.each(NAMES)('%s goes out as ASCII and comes back whole', (name) => {
    const header = dispositionFor(name);
    expect(/^[\x20-\x7e]*$/.test(header)).toBe(true);
    expect(contentDisposition.parse(header).parameters.filename).toBe(name);
    expect(() => new Headers({ 'content-disposition': header })).not.toThrow();
  });

  it('CR, LF and NUL never reach a header', () => {
    const header = dispositionFor('two\r\nlines\u0000.csv', 'inline');
    expect(header).not.toMatch(/[\r\n\0]/);
    expect(contentDisposition.parse(header).type).toBe('inline');
  });

  it('reads the upload header: percent-encoded, a bare %, controls and slashes', () => {
    expect(fileNameFromHeader(encodeURIComponent('Zündung—bay2.csv'))).toBe('Zündung—bay2.csv');
    expect(fileNameFromHeader('100%.csv')).toBe('100%.csv');
    expect(fileNameFromHeader(encodeURIComponent('../../etc/passwd'))).toBe('.._.._etc_passwd');
    expect(fileNameFromHeader(encodeURIComponent('a\r\nb.csv'))).toBe('a  b.csv');
    expect(fileNameFromHeader(null)).toBe('capture.csv');
  });
});
