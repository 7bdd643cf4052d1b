/**
 * The role matrix: every route's contract (server/api/routes/) × (anonymous, owner, technician, advisor, owner of
 * another shop), with PRODUCT.md's role table as the expectation. A contract without a row here fails the test
 * (tests/server/api-description.test.ts holds every route file to its contract).
 */
import { readFileSync } from 'node:fs';
import { type APIRequestContext, type APIResponse, expect, test } from '@playwright/test';
import Ajv2020Module from 'ajv/dist/2020.js';
import type { RouteContract } from '@/server/api/contract';
import { ROUTES } from '@/server/api/routes';
import { DEMO, newContext, signIn, signUpVerified, unique } from './helpers';

type Actor = 'anon' | 'owner' | 'technician' | 'advisor' | 'other';
const ACTORS: Actor[] = ['anon', 'technician', 'advisor', 'other', 'owner'];

interface Fixture {
  captureId: string;
  reportJobId: string;
  reportId: string;
  linkId: string;
  jobId: string;
  vehicleId: string;
  advisorMemberId: string;
  invitationIds: string[];
}

interface Row {
  file: string;
  method: string;
  call: (ctx: APIRequestContext, f: Fixture) => Promise<APIResponse>;
  expect: Record<Actor, number>;
}

const job = (ro: string) => ({
  repairOrder: ro,
  concern: 'Rough idle when cold.',
  vehicle: { make: 'Test', model: 'Matrix', engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } },
});
let seq = 0;
// A real capture (tooth times) with one more tooth per call, so no two uploads are the same file.
const TEETH = readFileSync('samples/i4-60-2-tooth-times.csv', 'utf8');
const upload = (c: APIRequestContext, jobId: string) =>
  c.post(`/api/jobs/${jobId}/captures`, {
    headers: { 'content-type': 'text/csv', 'x-file-name': `matrix-${++seq}.csv` },
    data: Buffer.from(`${TEETH}${(5.28 + seq / 1e5).toFixed(7)}\n`),
  });
const settings = { engine: { cylinders: 4, firingOrder: [1, 3, 4, 2] } };
const profile = { label: `Matrix profile ${seq}`, engine: { cylinders: 4, layout: 'inline', firingOrder: '1-3-4-2' } };

const ROWS: Row[] = [
  { file: 'auth/[...all]', method: 'GET', call: (c) => c.get('/api/auth/get-session'), expect: { anon: 200, owner: 200, technician: 200, advisor: 200, other: 200 } },
  { file: 'auth/[...all]', method: 'POST', call: (c) => c.post('/api/auth/organization/invite-member', { data: { email: 'x@example.com', role: 'owner' } }), expect: { anon: 404, owner: 404, technician: 404, advisor: 404, other: 404 } },
  { file: 'jobs', method: 'GET', call: (c) => c.get('/api/jobs'), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 200 } },
  { file: 'jobs', method: 'POST', call: (c) => c.post('/api/jobs', { data: job(`RM-${++seq}`) }), expect: { anon: 401, owner: 200, technician: 200, advisor: 403, other: 200 } },
  { file: 'jobs/[jobId]', method: 'GET', call: (c, f) => c.get(`/api/jobs/${f.jobId}`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'jobs/[jobId]', method: 'PATCH', call: (c, f) => c.patch(`/api/jobs/${f.jobId}`, { data: { status: 'open' } }), expect: { anon: 401, owner: 200, technician: 200, advisor: 403, other: 404 } },
  // Reopening an open job: every role may move a job (409: it is open already), another shop's is a 404.
  { file: 'jobs/[jobId]/status', method: 'POST', call: (c, f) => c.post(`/api/jobs/${f.jobId}/status`, { data: { status: 'open' } }), expect: { anon: 401, owner: 409, technician: 409, advisor: 409, other: 404 } },
  { file: 'jobs/[jobId]/cautions', method: 'POST', call: (c, f) => c.post(`/api/jobs/${f.jobId}/cautions`, { data: {} }), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'jobs/[jobId]', method: 'DELETE', call: (c) => c.delete('/api/jobs/no-such-job'), expect: { anon: 401, owner: 404, technician: 403, advisor: 403, other: 404 } },
  { file: 'jobs/[jobId]/captures', method: 'GET', call: (c, f) => c.get(`/api/jobs/${f.jobId}/captures`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'jobs/[jobId]/captures', method: 'POST', call: (c, f) => upload(c, f.jobId), expect: { anon: 401, owner: 200, technician: 200, advisor: 403, other: 404 } },
  { file: 'captures/[captureId]', method: 'GET', call: (c, f) => c.get(`/api/captures/${f.captureId}`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'captures/[captureId]/raw', method: 'GET', call: (c, f) => c.get(`/api/captures/${f.captureId}/raw`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'captures/[captureId]/analyses', method: 'GET', call: (c, f) => c.get(`/api/captures/${f.captureId}/analyses`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'captures/[captureId]/analyses', method: 'POST', call: (c, f) => c.post(`/api/captures/${f.captureId}/analyses`, { data: { settings } }), expect: { anon: 401, owner: 200, technician: 200, advisor: 403, other: 404 } },
  { file: 'jobs/[jobId]/report', method: 'GET', call: (c, f) => c.get(`/api/jobs/${f.reportJobId}/report`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'jobs/[jobId]/report', method: 'PUT', call: (c, f) => c.put(`/api/jobs/${f.reportJobId}/report`, { data: { interpretation: 'x' } }), expect: { anon: 401, owner: 200, technician: 200, advisor: 403, other: 404 } },
  { file: 'jobs/[jobId]/report/sign', method: 'POST', call: (c, f) => c.post(`/api/jobs/${f.reportJobId}/report/sign`, { data: { reportId: f.reportId } }), expect: { anon: 401, owner: 409, technician: 409, advisor: 403, other: 404 } },
  { file: 'reports/[reportId]/pdf', method: 'GET', call: (c, f) => c.get(`/api/reports/${f.reportId}/pdf`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'reports/[reportId]/send', method: 'POST', call: (c, f) => c.post(`/api/reports/${f.reportId}/send`, { data: { to: 'advisor-inbox@example.com' } }), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'reports/[reportId]/share', method: 'GET', call: (c, f) => c.get(`/api/reports/${f.reportId}/share`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'reports/[reportId]/share', method: 'POST', call: (c, f) => c.post(`/api/reports/${f.reportId}/share`, { data: {} }), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'share-links/[linkId]', method: 'DELETE', call: (c, f) => c.delete(`/api/share-links/${f.linkId}`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'health', method: 'GET', call: (c) => c.get('/api/health'), expect: { anon: 200, owner: 200, technician: 200, advisor: 200, other: 200 } },
  { file: 'public/decision', method: 'POST', call: (c) => c.post('/api/public/decision', { data: { token: 'A'.repeat(43), decision: 'approve', typedName: 'Guess' } }), expect: { anon: 404, owner: 404, technician: 404, advisor: 404, other: 404 } },
  { file: 'profiles', method: 'GET', call: (c) => c.get('/api/profiles'), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 200 } },
  { file: 'profiles', method: 'POST', call: (c) => c.post('/api/profiles', { data: profile }), expect: { anon: 401, owner: 200, technician: 403, advisor: 403, other: 200 } },
  { file: 'vehicles', method: 'GET', call: (c) => c.get('/api/vehicles'), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 200 } },
  { file: 'vehicles', method: 'POST', call: (c) => c.post('/api/vehicles', { data: job('x').vehicle }), expect: { anon: 401, owner: 200, technician: 200, advisor: 403, other: 200 } },
  { file: 'vehicles/[vehicleId]', method: 'GET', call: (c, f) => c.get(`/api/vehicles/${f.vehicleId}`), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 404 } },
  { file: 'openapi.json', method: 'GET', call: (c) => c.get('/api/openapi.json'), expect: { anon: 200, owner: 200, technician: 200, advisor: 200, other: 200 } },
  { file: 'shop', method: 'GET', call: (c) => c.get('/api/shop'), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 200 } },
  // The demo shop's own settings again, so other tests see no change.
  { file: 'shop', method: 'PATCH', call: (c) => c.patch('/api/shop', { data: { timeZone: 'America/Chicago', temperatureUnit: 'F' } }), expect: { anon: 401, owner: 200, technician: 403, advisor: 403, other: 200 } },
  { file: 'shop/invitations', method: 'POST', call: (c) => c.post('/api/shop/invitations', { data: { email: unique('inv'), role: 'advisor' } }), expect: { anon: 401, owner: 200, technician: 403, advisor: 403, other: 200 } },
  { file: 'shop/invitations/[invitationId]', method: 'DELETE', call: (c, f) => c.delete(`/api/shop/invitations/${f.invitationIds[0]}`), expect: { anon: 401, owner: 200, technician: 403, advisor: 403, other: 404 } },
  { file: 'shop', method: 'DELETE', call: (c) => c.delete('/api/shop', { data: { confirmName: 'Not the shop’s name' } }), expect: { anon: 401, owner: 400, technician: 403, advisor: 403, other: 400 } },
  { file: 'shop/export', method: 'GET', call: (c) => c.get('/api/shop/export'), expect: { anon: 401, owner: 200, technician: 403, advisor: 403, other: 200 } },
  { file: 'shop/retention', method: 'PATCH', call: (c) => c.patch('/api/shop/retention', { data: { retentionDays: 0 } }), expect: { anon: 401, owner: 400, technician: 403, advisor: 403, other: 400 } },
  { file: 'shop/members/[memberId]', method: 'PATCH', call: (c, f) => c.patch(`/api/shop/members/${f.advisorMemberId}`, { data: { role: 'advisor' } }), expect: { anon: 401, owner: 200, technician: 403, advisor: 403, other: 404 } },
  { file: 'shop/members/[memberId]', method: 'DELETE', call: (c) => c.delete('/api/shop/members/no-such-member'), expect: { anon: 401, owner: 404, technician: 403, advisor: 403, other: 404 } },
  { file: 'shops', method: 'GET', call: (c) => c.get('/api/shops'), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 200 } },
  // Last: creating a shop makes it the creator's active shop.
  { file: 'shops', method: 'POST', call: (c) => c.post('/api/shops', { data: { name: `Extra shop ${++seq}` } }), expect: { anon: 401, owner: 200, technician: 200, advisor: 200, other: 200 } },
];

/** Every route's contract (server/api/routes/), by its route folder under app/api: {jobId} → [jobId], {path} → [...all]. */
function routes(): { file: string; method: string; contract: RouteContract }[] {
  return ROUTES.map((contract) => ({
    file: contract.path.replace(/^\/api\//, '').replace('{path}', '[...all]').replace(/\{([^}]+)\}/g, '[$1]'),
    method: contract.method,
    contract,
  }));
}

test('every route contract has a row in the role matrix, and every row a contract', () => {
  const missing = routes().filter((r) => !ROWS.some((x) => x.file === r.file && x.method === r.method));
  expect(missing.map((r) => `${r.method} ${r.file}`), 'routes missing from the role matrix').toEqual([]);
  const stale = ROWS.filter((x) => !routes().some((r) => r.file === x.file && r.method === x.method));
  expect(stale.map((x) => `${x.method} ${x.file}`), 'rows for routes that do not exist').toEqual([]);
});

test('role matrix: session → role → shop scope on every route', async () => {
  const ctx: Record<Actor, APIRequestContext> = {
    anon: await newContext(),
    owner: await signIn(DEMO.owner),
    technician: await signIn(DEMO.technician),
    advisor: await signIn(DEMO.advisor),
    other: await signUpVerified(unique('other-owner'), 'Other Owner'),
  };
  expect((await ctx.other.post('/api/shops', { data: { name: 'Another Shop' } })).status()).toBe(200);
  const jobs = (await (await ctx.owner.get('/api/jobs')).json()).jobs;
  const shop = await (await ctx.owner.get('/api/shop')).json();
  const demoJob = jobs.find((j: { repairOrder: string }) => j.repairOrder === 'RO-24101');
  const demoCaptures = (await (await ctx.owner.get(`/api/jobs/${demoJob.id}/captures`)).json()).captures;
  const candidates = (await (await ctx.owner.get(`/api/jobs/${demoJob.id}/report`)).json()).candidates;
  const draft = (await (await ctx.owner.put(`/api/jobs/${demoJob.id}/report`, { data: { analysisIds: [candidates[0].id] } })).json()).report;
  expect((await ctx.owner.post(`/api/jobs/${demoJob.id}/report/sign`, { data: { reportId: draft.id } })).status()).toBe(200);
  const link = (await (await ctx.owner.post(`/api/reports/${draft.id}/share`, { data: {} })).json()).link;
  const fixture: Fixture = {
    captureId: demoCaptures[0].id,
    reportJobId: demoJob.id,
    reportId: draft.id,
    linkId: link.id,
    jobId: jobs[0].id,
    vehicleId: jobs[0].vehicle.id,
    advisorMemberId: shop.members.find((m: { email: string }) => m.email === DEMO.advisor).id,
    invitationIds: [],
  };
  const inv = await ctx.owner.post('/api/shop/invitations', { data: { email: unique('cancel-me'), role: 'technician' } });
  fixture.invitationIds.push((await inv.json()).invitation.id);

  // Another shop's list holds none of the demo shop's jobs.
  const otherJobs = (await (await ctx.other.get('/api/jobs')).json()).jobs as { id: string }[];
  expect(otherJobs.some((j) => j.id === fixture.jobId)).toBe(false);

  // Every JSON answer of 200 is checked against the output schema its route's contract declares (zod), and
  // against the same schema as published in /api/openapi.json (JSON Schema 2020-12, validated by Ajv), so neither
  // the contract nor the description can drift from what the routes answer.
  const doc = await (await ctx.anon.get('/api/openapi.json')).json();
  // The package is CommonJS: its class is the default export's default.
  const Ajv2020 = (Ajv2020Module as unknown as { default: typeof Ajv2020Module }).default ?? Ajv2020Module;
  const ajv = new Ajv2020({ strict: false, allErrors: true, validateFormats: false });
  ajv.addSchema(doc, 'openapi');
  const pointer = (s: string) => s.replace(/~/g, '~0').replace(/\//g, '~1');
  const failures: string[] = [];
  const drift: string[] = [];
  let checked = 0;
  for (const row of ROWS) {
    for (const actor of ACTORS) {
      const res = await row.call(ctx[actor], fixture);
      if (res.status() !== row.expect[actor]) failures.push(`${row.method} ${row.file} as ${actor}: ${res.status()}, expected ${row.expect[actor]}`);
      if (res.status() !== 200 || !(res.headers()['content-type'] ?? '').includes('application/json') || row.file.startsWith('auth/')) continue;
      const path = `/api/${row.file.replace(/\[([^\]]+)\]/g, '{$1}')}`;
      const at = `openapi#/paths/${pointer(path)}/${row.method.toLowerCase()}/responses/200/content/${pointer('application/json')}/schema`;
      const validate = ajv.getSchema(at) ?? (doc.paths?.[path]?.[row.method.toLowerCase()] ? ajv.compile({ $ref: at }) : null);
      if (!validate) {
        drift.push(`${row.method} ${path}: not in the API description`);
        continue;
      }
      checked++;
      const body = await res.json();
      if (!validate(body)) drift.push(`${row.method} ${path} as ${actor}: ${ajv.errorsText(validate.errors)}`);
      const contract = routes().find((r) => r.file === row.file && r.method === row.method)!.contract;
      const parsed = typeof contract.output === 'string' ? null : contract.output.safeParse(body);
      if (parsed && !parsed.success) drift.push(`${row.method} ${path} as ${actor}, against its contract: ${parsed.error.message}`);
    }
  }
  expect(failures).toEqual([]);
  expect(drift, 'answers that differ from the API description').toEqual([]);
  expect(checked).toBeGreaterThan(40);
});
