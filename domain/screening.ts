/**
 * The engine's first reading of a new capture, made twice: in the browser while the file uploads (so the bars
 * appear before the upload finishes) and by the server while it screens the upload. The upload answer carries
 * the server's; the page compares the two and says where they differ rather than hiding it.
 */
import { z } from 'zod';
import type { AnalysisResult } from '@/signal';

export const screeningSchema = z.object({
  engineVersion: z.string(),
  verdict: z.enum(['ok', 'low', 'high', 'uncertain']),
  crankingRpm: z.number(),
  cylinders: z.array(z.object({ cylinder: z.number().int(), relativePercent: z.number().nullable(), status: z.enum(['ok', 'low', 'high', 'uncertain']) })),
});
export type Screening = z.infer<typeof screeningSchema>;

export function screeningSummary(r: AnalysisResult): Screening {
  return {
    engineVersion: r.engineVersion,
    verdict: r.verdict,
    crankingRpm: r.crankingRpm,
    cylinders: r.cylinders.map((c) => ({ cylinder: c.cylinder, relativePercent: c.relativePercent, status: c.status })),
  };
}

const pct = (x: number | null) => (x === null ? 'no figure' : `${x} %`);

/** Where the browser's reading and the server's differ, in plain sentences; empty when they agree. */
export function screeningDifferences(here: Screening, server: Screening): string[] {
  const out: string[] = [];
  if (here.engineVersion !== server.engineVersion) out.push(`This page runs engine ${here.engineVersion}, the server ${server.engineVersion}; reload the page to get the server's version.`);
  if (here.verdict !== server.verdict) out.push(`Verdict: ${here.verdict} on this device, ${server.verdict} on the server.`);
  for (const s of server.cylinders) {
    const h = here.cylinders.find((c) => c.cylinder === s.cylinder);
    if (!h) out.push(`Cylinder ${s.cylinder}: read by the server only.`);
    else if (h.relativePercent !== s.relativePercent || h.status !== s.status) out.push(`Cylinder ${s.cylinder}: ${pct(h.relativePercent)} (${h.status}) on this device, ${pct(s.relativePercent)} (${s.status}) on the server.`);
  }
  for (const h of here.cylinders) if (!server.cylinders.some((s) => s.cylinder === h.cylinder)) out.push(`Cylinder ${h.cylinder}: read on this device only.`);
  return out;
}
