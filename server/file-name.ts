/**
 * File names from clients and into headers. A name arrives percent-encoded in X-File-Name (the upload screen
 * encodes it; a bare `%`, as in "100%.csv", is kept as sent) and leaves in Content-Disposition as RFC 6266
 * describes: an ASCII fallback plus the exact name in RFC 5987's filename*, built by the `content-disposition`
 * package. Control characters (CR, LF, NUL) become spaces; slashes become underscores.
 */
import 'server-only';
import contentDisposition from 'content-disposition';

/** The stored name for an upload's X-File-Name header (at most 200 characters). */
export function fileNameFromHeader(raw: string | null, fallback = 'capture.csv'): string {
  if (!raw) return fallback;
  let name = raw;
  try {
    name = decodeURIComponent(raw);
  } catch {
    // Not percent-encoded after all: keep it as sent.
  }
  const clean = withoutControls(name).replace(/[\\/]/g, '_').trim().slice(0, 200);
  return clean || fallback;
}

/** A Content-Disposition header for `name`, safe in any script. */
export function dispositionFor(name: string, type: 'attachment' | 'inline' = 'attachment'): string {
  const clean = withoutControls(name);
  // The fallback is plain ASCII (Latin-1 letters too are replaced), so the header is the same bytes everywhere.
  const ascii = [...clean].map((ch) => (ch.codePointAt(0)! > 126 ? '?' : ch)).join('');
  return contentDisposition(clean, { type, fallback: ascii });
}

/** The text with every control character (C0 and DEL) as a space. */
export function withoutControls(s: string): string {
  let out = '';
  for (const ch of s) {
    const c = ch.codePointAt(0)!;
    out += c < 32 || c === 127 ? ' ' : ch;
  }
  return out;
}
