/**
 * One contract per route (server/api/contract.ts): every route file under app/api and every method it exports
 * serves a contract at its own path and method, and no contract is left without a route; the published document
 * is OpenAPI 3.1 (the specification's required fields: openapi, info.title, info.version, paths), each path
 * parameter in a template is declared, the request schemas are the routes' own, and who may call is read from the
 * role table (PRODUCT.md's roles). The role matrix (tests/e2e/role-matrix.spec.ts) validates every real answer
 * against the contracts' output schemas.
 */
import { readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { jobSchema } from '@/domain/job';
import { whoMay } from '@/server/api/contract';
import { apiDescription } from '@/server/api/description';
import { contractAt, ROUTES } from '@/server/api/routes';

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? routeFiles(p) : n === 'route.ts' ? [p] : [];
  });
}

/** The path a route file serves, in OpenAPI's template form: [jobId] → {jobId}, [...all] → {path}. */
function servedPath(file: string): string {
  const dir = relative('app', file).replace(/\/route\.ts$/, '');
  return `/${dir.replace(/\[\.\.\.[^\]]+\]/g, '{path}').replace(/\[([^\]]+)\]/g, '{$1}')}`;
}

const METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;

describe('route contracts and the API description', () => {
  const files = routeFiles('app/api');
  const doc = apiDescription('http://127.0.0.1:3000') as { openapi: string; info: { title: string; version: string }; paths: Record<string, Record<string, { parameters?: { in: string; name: string }[]; description?: string }>> };

  it('every route file’s methods serve the contract at their own path, and every contract has its route', async () => {
    expect(files.length).toBeGreaterThan(20);
    const served = new Set<string>();
    for (const file of files) {
      const mod = (await import(`@/${file.replace(/\.ts$/, '')}`)) as Record<string, unknown>;
      const path = servedPath(file);
      const methods = METHODS.filter((m) => typeof mod[m] === 'function');
      expect(methods.length, path).toBeGreaterThan(0);
      for (const m of methods) {
        const contract = contractAt(m, path);
        expect(contract, `${m} ${path} has no contract`).toBeDefined();
        served.add(`${m} ${path}`);
        // better-auth's catch-all hands requests on as they are; every other handler is wrapped with its contract.
        if (!path.startsWith('/api/auth/') && path !== '/api/health' && path !== '/api/openapi.json') {
          expect((mod[m] as { contract?: unknown }).contract, `${m} ${path} is not wrapped with its contract`).toBe(contract);
        }
      }
    }
    for (const c of ROUTES) expect(served.has(`${c.method} ${c.path}`), `${c.method} ${c.path} has a contract but no route`).toBe(true);
    expect(new Set(ROUTES.map((c) => `${c.method} ${c.path}`)).size, 'one contract per method and path').toBe(ROUTES.length);
  }, 60_000);

  it('is an OpenAPI 3.1 document with every path parameter declared', () => {
    expect(doc.openapi).toBe('3.1.0');
    expect(doc.info.title).toBeTruthy();
    expect(doc.info.version).toBeTruthy();
    for (const [path, ops] of Object.entries(doc.paths)) {
      const names = [...path.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]);
      for (const [method, op] of Object.entries(ops)) {
        const declared = (op.parameters ?? []).filter((p) => p.in === 'path').map((p) => p.name);
        expect(declared.sort(), `${method} ${path}`).toEqual(names.sort());
      }
    }
  });

  it('describes a request body with the route’s own schema', () => {
    expect(contractAt('POST', '/api/jobs')?.body).toBe(jobSchema);
    const body = (doc.paths['/api/jobs'].post as unknown as { requestBody: { content: Record<string, { schema: unknown }> } }).requestBody.content['application/json'].schema;
    expect(JSON.stringify(body)).toContain('repairOrder');
  });

  it('says who may call from the role table (PRODUCT.md: owners remove jobs, technicians edit, advisors read and send)', () => {
    expect(whoMay(contractAt('DELETE', '/api/jobs/{jobId}')!)).toBe('owners');
    expect(whoMay(contractAt('PATCH', '/api/jobs/{jobId}')!)).toBe('owners and technicians');
    expect(whoMay(contractAt('POST', '/api/reports/{reportId}/send')!)).toBe('any member of the shop');
    expect(whoMay(contractAt('POST', '/api/public/decision')!)).toBe('anyone with the link');
    expect(doc.paths['/api/jobs/{jobId}'].delete.description).toBe('Who: owners.');
  });
});
