/** Contracts of the capture routes: a capture, its file and its saved analyses (server/api/contract.ts). */
import { z } from 'zod';
import { route } from '../contract';
import { idParam, saveAnalysisInput } from '../inputs';
import { analysis, capture } from '../shapes';

const captureId = idParam('captureId');

export const getCapture = route({
  method: 'GET',
  path: '/api/captures/{captureId}',
  summary: 'A capture’s record and its saved analyses.',
  access: { permission: { capture: ['read'] } },
  params: captureId,
  output: z.object({ capture, analyses: z.array(analysis) }),
});

export const downloadCapture = route({
  method: 'GET',
  path: '/api/captures/{captureId}/raw',
  summary: 'The capture file as uploaded (Content-Disposition with its name).',
  access: { permission: { capture: ['read'] } },
  params: captureId,
  output: 'text/csv',
});

export const listAnalyses = route({
  method: 'GET',
  path: '/api/captures/{captureId}/analyses',
  summary: 'The capture’s saved analyses, newest first.',
  access: { permission: { analysis: ['read'] } },
  params: captureId,
  output: z.object({ analyses: z.array(analysis) }),
});

export const saveAnalysis = route({
  method: 'POST',
  path: '/api/captures/{captureId}/analyses',
  summary: 'Runs the engine on the stored capture with these settings and saves the result (nothing is overwritten).',
  access: { permission: { analysis: ['save'] } },
  params: captureId,
  body: saveAnalysisInput,
  output: z.object({ analysis }),
  errors: [413, 415, 422, 503],
});
