/**
 * A job's captures. POST streams a text capture (up to 256 MB): refuses what is too large (413) or not text
 * (415), hashes it (SHA-256), compresses it in 1 MB chunk rows and stores it in one transaction; the same
 * file twice on a job is a 409 naming the capture already there.
 */
import { createHash } from 'node:crypto';
import { z } from 'zod';
import { CHUNK_BYTES as CHUNK, compressPiece } from '@/db/chunks';
import { recordAudit } from '@/db/queries/audit';
import { createCapture, DuplicateCaptureError, listCaptures } from '@/db/queries/captures';
import { getJob } from '@/db/queries/jobs';
import { HttpError, notFound } from '@/server/http';
import { withShop } from '@/server/with-shop';
import { isCaptureError } from '@/signal';
import { CaptureImporter, MAX_CAPTURE_BYTES } from '@/signal/import/import-capture';

const TEXT_TYPES = /^(text\/(csv|plain|tab-separated-values)|application\/(csv|vnd\.ms-excel|octet-stream))\b/i;

export const GET = withShop({ capture: ['read'] }, z.object({ jobId: z.string() }), async ({ input, shop }) => {
  if (!(await getJob(shop.id, input.jobId))) throw notFound('That job');
  return { captures: await listCaptures(shop.id, input.jobId) };
});

/** Reads the first megabyte as the analysis will: a file it cannot read is refused before anything is stored. */
function checkReadable(head: Uint8Array, size: number): void {
  const importer = new CaptureImporter(head, size);
  // A cut-off last line is expected here: only the head was pushed.
  const cut = head.lastIndexOf(10);
  importer.push(cut > 0 && head.length < size ? head.subarray(0, cut + 1) : head);
  importer.finish();
}

const tooLarge = () => new HttpError(413, 'TOO_LARGE', 'The file is larger than 256 MB; export a shorter window around the cranking.');

export const POST = withShop(
  { capture: ['upload'] },
  z.object({ jobId: z.string() }),
  async ({ input, shop, user, req }) => {
    const length = Number(req.headers.get('content-length') ?? 0);
    if (length > MAX_CAPTURE_BYTES) throw tooLarge();
    const type = (req.headers.get('content-type') ?? 'application/octet-stream').split(';')[0].trim();
    if (!TEXT_TYPES.test(type)) {
      throw new HttpError(415, 'NOT_TEXT', `A capture is a text file (CSV or TSV); this one was sent as ${type}. Export the capture as text from the scope or logger.`);
    }
    const rawName = req.headers.get('x-file-name');
    const fileName = (rawName ? decodeURIComponent(rawName) : 'capture.csv').replace(/[\\/\0]/g, '_').slice(0, 200) || 'capture.csv';
    if (!(await getJob(shop.id, input.jobId))) throw notFound('That job');
    if (!req.body) throw new HttpError(400, 'EMPTY_FILE', 'The upload was empty; choose the capture file again.');

    const hash = createHash('sha256');
    const chunks: Uint8Array[] = [];
    let size = 0;
    let pending: Uint8Array[] = [];
    let pendingBytes = 0;
    let checkedText = false;
    let firstPiece: Uint8Array | null = null;
    const flush = () => {
      if (pendingBytes === 0) return;
      const piece = Buffer.concat(pending, pendingBytes);
      if (!checkedText) {
        checkedText = true;
        const head = piece.subarray(0, 64 * 1024);
        if (head.includes(0) || (head[0] === 0xff && head[1] === 0xfe) || (head[0] === 0xfe && head[1] === 0xff)) {
          throw new HttpError(415, 'NOT_TEXT', 'This is not a plain-text capture (binary or UTF-16); export it as CSV or TSV text.');
        }
        firstPiece = piece;
      }
      hash.update(piece);
      chunks.push(compressPiece(piece));
      pending = [];
      pendingBytes = 0;
    };
    const reader = req.body.getReader();
    try {
      for (;;) {
        const { done, value } = await reader.read();
        if (done) break;
        size += value.length;
        if (size > MAX_CAPTURE_BYTES) throw tooLarge();
        pending.push(value);
        pendingBytes += value.length;
        if (pendingBytes >= CHUNK) flush();
      }
      flush();
    } catch (e) {
      await reader.cancel().catch(() => {});
      throw e;
    }
    if (size === 0) throw new HttpError(400, 'EMPTY_FILE', 'The file is empty; export the capture again.');
    try {
      checkReadable(firstPiece!, size);
    } catch (e) {
      if (isCaptureError(e)) {
        return Response.json({ error: { code: 'UNREADABLE_CAPTURE', message: `${e.message}`, engine: e.toJSON() } }, { status: 422 });
      }
      throw e;
    }
    const sha256 = hash.digest('hex');
    try {
      const capture = await createCapture(shop.id, { jobId: input.jobId, fileName, contentType: type, sizeBytes: size, sha256, chunks, uploadedBy: user.id });
      if (!capture) throw notFound('That job');
      await recordAudit(shop.id, user.id, 'capture.upload', { type: 'capture', id: capture.id }, { jobId: input.jobId, fileName, sizeBytes: size, sha256 });
      return { capture };
    } catch (e) {
      if (e instanceof DuplicateCaptureError) {
        return Response.json(
          { error: { code: 'DUPLICATE', message: `${fileName} is already on this job (same contents); open the existing capture instead.`, captureId: e.captureId } },
          { status: 409 },
        );
      }
      throw e;
    }
  },
  { rawBody: true },
);
