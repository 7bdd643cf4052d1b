/** Malformed captures, generated: each a name, its bytes, and whether any usable result may come of it. */

const enc = (s: string) => new TextEncoder().encode(s);
const rows = (n: number, f: (i: number) => string) => Array.from({ length: n }, (_, i) => f(i)).join('\n') + '\n';
const H = 'Time (s),Starter current [A]\n';

export interface BadCase {
  name: string;
  bytes: Uint8Array;
}

function utf16(s: string, be = false): Uint8Array {
  const out = new Uint8Array(2 + s.length * 2);
  out[0] = be ? 0xfe : 0xff;
  out[1] = be ? 0xff : 0xfe;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    out[2 + 2 * i + (be ? 1 : 0)] = c & 0xff;
    out[2 + 2 * i + (be ? 0 : 1)] = c >> 8;
  }
  return out;
}

/** A 36-2 wheel turning steadily (no compression) as a level log, with a glitch pair in every revolution. */
function toothLogWithGlitches(): string {
  const out: string[] = [];
  const pitchS = 60 / 200 / 36;
  for (let p = 0; p < 36 * 12; p++) {
    if (p % 36 >= 34) continue;
    const t = 0.2 + p * pitchS;
    out.push(`${t.toFixed(7)},1`, `${(t + pitchS / 2).toFixed(7)},0`);
    if (p % 36 === 10) out.push(`${(t + pitchS / 2 + 1e-6).toFixed(7)},1`, `${(t + pitchS / 2 + 2e-6).toFixed(7)},0`);
  }
  return out.join('\n') + '\n';
}

export function badCorpus(): BadCase[] {
  const cases: [string, Uint8Array | string][] = [
    ['empty', ''],
    ['one newline', '\n'],
    ['only blank lines', '\n\n\n\n'],
    ['header only', H],
    ['header and one row', `${H}0,1\n`],
    ['three rows', `${H}0,1\n0.001,2\n0.002,3\n`],
    ['png bytes', new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13])],
    ['zip bytes', new Uint8Array([0x50, 0x4b, 0x03, 0x04, 20, 0, 0, 0, 8, 0])],
    ['gzip bytes', new Uint8Array([0x1f, 0x8b, 0x08, 0, 0, 0, 0, 0, 0, 3, 0xcb, 0x48])],
    ['utf-16 le', utf16(`${H}${rows(20, (i) => `${i / 1000},${i}`)}`)],
    ['utf-16 be', utf16(`${H}${rows(20, (i) => `${i / 1000},${i}`)}`, true)],
    ['control characters', `${H}${rows(50, (i) => `${i / 1000},\u0001\u0002${i}`)}`],
    ['a 10 MB single line', '1,'.repeat(5 * 1024 * 1024)],
    ['space separated', rows(100, (i) => `${i / 1000} ${i}`)],
    ['pipe separated words', rows(100, () => 'a|b|c')],
    ['one column going up and down', `value\n${rows(200, (i) => `${(i * 37) % 11}`)}`],
    ['all NaN', `${H}${rows(500, () => 'NaN,NaN')}`],
    ['current all NaN', `${H}${rows(500, (i) => `${i / 1000},NaN`)}`],
    ['1e308 everywhere', `${H}${rows(500, (i) => `${i / 1000},1e308`)}`],
    ['-1e308 and 1e308 alternating', `${H}${rows(500, (i) => `${i / 1000},${i % 2 ? '1e308' : '-1e308'}`)}`],
    ['time going backwards', `${H}${rows(3000, (i) => `${(3000 - i) / 1000},${100 + (i % 50)}`)}`],
    ['time all the same', `${H}${rows(3000, (i) => `0,${100 + (i % 50)}`)}`],
    ['negative time', `${H}${rows(3000, (i) => `${-i / 1000},${100 + (i % 50)}`)}`],
    ['truncated mid-line', `${H}${rows(2000, (i) => `${i / 1000},${100 + (i % 50)}`)}0.2`],
    ['text in the middle', `${H}${rows(100, (i) => `${i / 1000},1`)}${rows(100, () => 'overflow,overflow')}${rows(100, (i) => `${i / 1000},1`)}`],
    ['ragged rows', `${H}${rows(500, (i) => (i % 3 ? `${i / 1000},1` : `${i / 1000}`))}`],
    ['extra fields', `${H}${rows(500, (i) => `${i / 1000},1,2,3`)}`],
    ['300 columns', `${Array.from({ length: 300 }, (_, i) => i).join(',')}\n`.repeat(10)],
    ['quoted everything', `"Time (s)","current [A]"\n${rows(500, (i) => `"${i / 1000}","${i % 7}"`)}`],
    ['decimal comma with comma delimiter', `${H}${rows(500, (i) => `0,${i},${i % 9},5`)}`],
    ['crlf flat current', `Time (s),current [A]\r\n${rows(4000, (i) => `${i / 1000},50\r`)}`],
    ['constant zero current', `${H}${rows(8000, (i) => `${i / 1000},0`)}`],
    ['pure noise current', `${H}${rows(8000, (i) => `${i / 1000},${((i * 7919) % 101) - 50}`)}`],
    ['square wave current', `${H}${rows(8000, (i) => `${i / 1000},${Math.floor(i / 40) % 2 ? 300 : 0}`)}`],
    ['clipped sine current', `${H}${rows(8000, (i) => `${i / 1000},${Math.min(150, 100 + 80 * Math.sin(i / 12)).toFixed(1)}`)}`],
    ['a single spike', `${H}${rows(8000, (i) => `${i / 1000},${i === 4000 ? 900 : 20}`)}`],
    ['sample index without rate', `Sample,current [A]\n${rows(2000, (i) => `${i},${i % 13}`)}`],
    ['only free text then numbers far below', `${rows(3000, () => 'notes about the car')}${H}${rows(10, (i) => `${i},1`)}`],
    ['sync only', `Time (s),Cyl 1 sync [V]\n${rows(5000, (i) => `${i / 1000},${i % 300 < 3 ? 5 : 0}`)}`],
    ['tooth times decreasing', `Tooth edge time (s)\n${rows(500, (i) => `${(500 - i) * 0.003}`)}`],
    ['tooth times without gaps', `Tooth edge time (s)\n${rows(2000, (i) => `${(i * 0.003).toFixed(6)}`)}`],
    ['tooth times two per second', `Tooth edge time (s)\n${rows(20, (i) => `${i * 0.5}`)}`],
    ['rpm logged at 10 Hz', `Time (s),Engine speed [rpm]\n${rows(60, (i) => `${(i / 10).toFixed(1)},${200 + (i % 3)}`)}`],
    ['hall waveform too slow to sample', `Time (s),Crank sensor [V]\n${rows(3000, (i) => `${i / 200},${i % 2 ? 5 : 0}`)}`],
    ['huge time gap', `${H}${rows(2000, (i) => `${i < 1000 ? i / 1000 : i / 1000 + 1000},${100 + (i % 50)}`)}`],
    ['unicode digits', `${H}${rows(100, (i) => `${i}\u0660,\u0661`)}`],
    ['bom then a flat current', `\ufeff${H}${rows(3000, (i) => `${i / 1000},${80 + ((i * 13) % 3)}`)}`],
    ['exponent soup', `${H}${rows(500, (i) => `${i}e-3,1e1e1`)}`],
    ['minus signs everywhere', `${H}${rows(500, (i) => `-${i}-,--5`)}`],
    ['semicolons and tabs mixed', rows(500, (i) => (i % 2 ? `${i};1` : `${i}\t1`))],
    ['very long numbers', `${H}${rows(300, (i) => `0.${'1'.repeat(60)}${i},${'9'.repeat(40)}`)}`],
    // Edge logs, VR waveforms, tooth logs and units rows (engine 1.2): a sentence or `uncertain`, never a figure.
    ['edge log with the crank stuck', `Time[s], Channel 0, Channel 1\n0,1,0\n${rows(300, (i) => `${(0.5 + i * 0.0173 + (i % 7) * 0.0021).toFixed(6)},1,${i % 2}`)}`],
    ['VR waveform of pure noise', `Time (s),Crank sensor [V]\n${rows(20000, (i) => `${(i / 20000).toFixed(6)},${((((i * 7919) % 1009) / 1009 - 0.5) * 0.6).toFixed(3)}`)}`],
    ['tooth log with glitches on every revolution', `Time[s], Primary\n0,0\n${toothLogWithGlitches()}`],
    ['units row with unknown units', `Time,Current\n(ticks),(furlongs)\n${rows(3000, (i) => `${i},${100 + (i % 50)}`)}`],
    ['a number field of 200,000 digits', `${H}${rows(3000, (i) => `${i / 1000},${i === 5 ? '1'.repeat(200_000) : 100 + (i % 50)}`)}`],
    ['header repeated in the middle', `${H}${rows(200, (i) => `${i / 1000},1`)}${H}${rows(200, (i) => `${i / 1000},1`)}`],
  ];
  return cases.map(([name, b]) => ({ name, bytes: typeof b === 'string' ? enc(b) : b }));
}
