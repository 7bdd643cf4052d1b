/**
 * A job's captures. POST receives a text capture (up to MAX_CAPTURE_BYTES, see server/receive-capture.ts) and stores it
 * in one transaction; the same file twice on a job is a 409 naming the capture already there.
 */
import { recordAudit } from '@/db/queries/audit';
import { createCapture, DuplicateCaptureError, listCaptures } from '@/db/queries/captures';
import { getJob } from '@/db/queries/jobs';
import { fileNameFromHeader } from '@/server/file-name';
import { HttpError, notFound } from '@/server/http';
import { checkUploadHeaders, receiveCapture } from '@/server/receive-capture';
import { withShop } from '@/server/with-shop';
import { screeningSummary } from '@/domain/screening';
import * as api from '@/server/api/routes/jobs';

export const GET = withShop(api.listCaptures, async ({ input, shop }) => {
  if (!(await getJob(shop.id, input.jobId))) throw notFound('That job');
  return { captures: await listCaptures(shop.id, input.jobId) };
});

export const POST = withShop(
  api.uploadCapture, async ({ input, shop, user, req }) => {
    const { length, contentType } = checkUploadHeaders(req.headers);
    const job = await getJob(shop.id, input.jobId);
    if (!job) throw notFound('That job');
    if (!req.body) throw new HttpError(400, 'EMPTY_FILE', 'The upload was empty; choose the capture file again.');
    const rawName = req.headers.get('x-file-name');
    const fileName = fileNameFromHeader(rawName);
    const { screening, ...file } = await receiveCapture(req.body, length, contentType, job.vehicle.engine, req.signal);
    try {
      const capture = await createCapture(shop.id, { jobId: input.jobId, fileName, uploadedBy: user.id, ...file }, req.signal);
      if (!capture) throw notFound('That job');
      await recordAudit(shop.id, user.id, 'capture.upload', { type: 'capture', id: capture.id }, { jobId: input.jobId, fileName, sizeBytes: file.sizeBytes, sha256: file.sha256 });
      // The server's own reading with the job's engine: the page compares it with the one the browser made.
      return { capture, screening: screeningSummary(screening) };
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
);
