/**
 * Saving an analysis: the server re-runs the same engine (in its thread pool) on the stored raw file with the given settings and
 * stores settings, engine version, file SHA-256, results and the report's trace excerpt. Nothing is overwritten; each save adds one.
 * A file the engine cannot read answers 422 with the engine's error code, line and column.
 */
import { recordAudit } from '@/db/queries/audit';
import { getCapture, listAnalyses, readCapturePacked, saveAnalysis } from '@/db/queries/captures';
import { notFound } from '@/server/http';
import { analyzeStored } from '@/server/engine/pool';
import { withShop } from '@/server/with-shop';
import { isCaptureError } from '@/signal';
import * as api from '@/server/api/routes/captures';
import { measuredNothing } from '@/domain/capture-policy';

export const GET = withShop(api.listAnalyses, async ({ input, shop }) => {
  if (!(await getCapture(shop.id, input.captureId))) throw notFound('That capture');
  return { analyses: await listAnalyses(shop.id, input.captureId) };
});

export const POST = withShop(api.saveAnalysis, async ({ input, shop, user, req }) => {
  const capture = await getCapture(shop.id, input.captureId);
  const packed = capture && (await readCapturePacked(shop.id, capture.id, req.signal));
  if (!capture || !packed) throw notFound('That capture');
  let result, trace;
  try {
    // In the engine's thread pool: the request thread stays free for everyone else.
    ({ result, trace } = await analyzeStored(packed, input.settings, req.signal));
  } catch (e) {
    if (isCaptureError(e)) {
      return Response.json(
        { error: { code: 'UNREADABLE_CAPTURE', message: e.message, engine: { code: e.code, line: e.line, column: e.column } } },
        { status: 422 },
      );
    }
    throw e;
  }
  if (measuredNothing(result)) {
    // The engine found nothing to measure: say so with its warning codes, and store nothing.
    return Response.json(
      { error: { code: 'NOTHING_TO_MEASURE', message: result.warnings.map((w) => w.message).join(' '), warnings: result.warnings }, result },
      { status: 422 },
    );
  }
  const analysis = await saveAnalysis(shop.id, {
    captureId: capture.id,
    settings: input.settings,
    engineVersion: result.engineVersion,
    fileSha256: capture.sha256,
    result,
    trace,
    verdict: result.verdict,
    crankingRpm: result.crankingRpm,
    createdBy: user.id,
  });
  if (!analysis) throw notFound('That capture');
  await recordAudit(shop.id, user.id, 'analysis.save', { type: 'analysis', id: analysis.id }, { captureId: capture.id, verdict: result.verdict });
  return { analysis };
});
