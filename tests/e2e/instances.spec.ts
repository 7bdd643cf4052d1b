/**
 * Two app instances on one PostgreSQL database (the PostgreSQL pass only), each request of a pair sent to a
 * different instance at the same moment, 100 times each:
 * - two tabs saving the same draft: one 200 and one 409, and the stored draft is the one that answered 200;
 * - a signing racing a save of the same draft: never both 200; what is signed is what its snapshot holds.
 */
import { expect, test } from '@playwright/test';
import { exited, freePort, signInCookie, startApp, waitReady } from '../../scripts/app-server';
import { createDatabase } from '../../scripts/pg-server.mjs';
import { DEMO } from './helpers';

test.describe.configure({ mode: 'serial' });
test.skip(!process.env.CRANKPRINT_TEST_PG_URL, 'two instances share a PostgreSQL server; the embedded database serves one process');

const ROUNDS = 100;
let a: ReturnType<typeof startApp>;
let b: ReturnType<typeof startApp>;
let cookie = '';

test.beforeAll(async () => {
  test.setTimeout(240_000);
  const env = { DATABASE_URL: await createDatabase(process.env.CRANKPRINT_TEST_PG_URL!, 'instances'), CRANKPRINT_RATE_LIMIT_SCALE: '100' };
  // One first, so the migrations and the demo shop are in place before the second starts.
  a = startApp(await freePort(), env);
  await waitReady(a);
  b = startApp(await freePort(), env);
  await waitReady(b);
  cookie = await signInCookie(a.base, DEMO.technician);
});

test.afterAll(async () => {
  for (const s of [a, b]) {
    if (s && s.child.exitCode === null) {
      s.child.kill('SIGTERM');
      await exited(s.child);
    }
  }
});

interface Revision {
  id: string;
  revision: number;
  version: number;
  status: 'draft' | 'signed';
  content: { nextSteps: string[] };
}
/** The parts of the answers these tests read. */
interface Body {
  jobs: { id: string }[];
  report: Revision;
  revisions: Revision[];
  candidates: { id: string }[];
}

/** A JSON request to one instance, with the signed-in cookie and that instance's own origin. */
async function call(base: string, method: string, path: string, body?: unknown): Promise<{ status: number; json: Body }> {
  const res = await fetch(`${base}${path}`, { method, headers: { cookie, origin: base, 'content-type': 'application/json' }, body: body === undefined ? undefined : JSON.stringify(body) });
  return { status: res.status, json: (await res.json().catch(() => ({}))) as Body };
}

/** A demo job whose vehicle has a saved analysis (a report needs one to be signed). */
async function jobWithAnalysis(): Promise<{ jobId: string; analysisId: string }> {
  const { json } = await call(a.base, 'GET', '/api/jobs');
  for (const j of json.jobs) {
    const r = await call(a.base, 'GET', `/api/jobs/${j.id}/report`);
    if (r.json.candidates.length && r.json.revisions.length === 0) return { jobId: j.id, analysisId: r.json.candidates[0].id };
  }
  throw new Error('no demo job with a saved analysis and no report');
}

const content = (analysisId: string, step: string) => ({ analysisIds: [analysisId], conditions: {}, interpretation: 'Two instances — “race”.', nextSteps: [step] });

test(`two tabs on two instances save the same draft: one lands, the other is told, ${ROUNDS} times`, async () => {
  test.setTimeout(300_000);
  const { jobId, analysisId } = await jobWithAnalysis();
  let latest = (await call(a.base, 'PUT', `/api/jobs/${jobId}/report`, content(analysisId, 'start'))).json.report;
  let wrong = 0;
  for (let i = 0; i < ROUNDS; i++) {
    const base = { revision: latest.revision, version: latest.version };
    const [x, y] = await Promise.all([
      call(a.base, 'PUT', `/api/jobs/${jobId}/report`, { ...content(analysisId, `A ${i}`), base }),
      call(b.base, 'PUT', `/api/jobs/${jobId}/report`, { ...content(analysisId, `B ${i}`), base }),
    ]);
    const statuses = [x.status, y.status].sort().join(' ');
    if (statuses !== '200 409') wrong++;
    const landed = x.status === 200 ? x : y;
    latest = landed.json.report;
    const stored = (await call(b.base, 'GET', `/api/jobs/${jobId}/report`)).json.revisions[0];
    if (stored.content.nextSteps[0] !== latest.content.nextSteps[0]) wrong++;
  }
  console.log(`instances: ${ROUNDS} two-tab races, ${wrong} wrong`);
  expect(wrong).toBe(0);
});

test(`a signing on one instance races a save on the other: never both, ${ROUNDS} times`, async () => {
  test.setTimeout(300_000);
  const { jobId, analysisId } = await jobWithAnalysis();
  let wrong = 0;
  let signedCount = 0;
  let latest = (await call(a.base, 'PUT', `/api/jobs/${jobId}/report`, content(analysisId, 'draft 0'))).json.report;
  for (let i = 0; i < ROUNDS; i++) {
    if (latest.status === 'signed') latest = (await call(a.base, 'PUT', `/api/jobs/${jobId}/report`, { ...content(analysisId, `draft ${i}`), base: { revision: latest.revision, version: latest.version } })).json.report;
    const [sign, save] = await Promise.all([
      call(a.base, 'POST', `/api/jobs/${jobId}/report/sign`, { reportId: latest.id, version: latest.version }),
      call(b.base, 'PUT', `/api/jobs/${jobId}/report`, { ...content(analysisId, `late save ${i}`), base: { revision: latest.revision, version: latest.version } }),
    ]);
    if (sign.status === 200 && save.status === 200) wrong++;
    if (sign.status !== 200 && save.status !== 200) wrong++;
    if (sign.status === 200) {
      signedCount++;
      // What is signed is the draft as it stood: its content, which the snapshot holds too.
      if (sign.json.report.content.nextSteps[0] !== latest.content.nextSteps[0]) wrong++;
      latest = sign.json.report;
    } else latest = save.json.report;
  }
  console.log(`instances: ${ROUNDS} sign-versus-save races, ${signedCount} signed first, ${wrong} wrong`);
  expect(wrong).toBe(0);
});
