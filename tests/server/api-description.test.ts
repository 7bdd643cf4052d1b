/**
 * The published API description: every route file under app/api and every method it exports has an entry, the
 * document is OpenAPI 3.1 (the specification's required fields: openapi, info.title, info.version, paths), each
 * path parameter in a template is declared, and the request schemas are the routes' own (a wrong body fails both).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { jobSchema } from '@/domain/job';
import { API, apiDescription } from '@/server/api/description';

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

function exportedMethods(file: string): string[] {
  const text = readFileSync(file, 'utf8');
  const named = [...text.matchAll(/export (?:const|function|async function) (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => m[1]);
  const listed = [...text.matchAll(/export \{([^}]+)\}/g)].flatMap((m) => [...m[1].matchAll(/as (GET|POST|PUT|PATCH|DELETE)\b/g)].map((x) => x[1]));
  return [...named, ...listed].map((m) => m.toLowerCase());
}

describe('API description', () => {
  const files = routeFiles('app/api');
  const doc = apiDescription('http://127.0.0.1:3000') as { openapi: string; info: { title: string; version: string }; paths: Record<string, Record<string, { parameters?: { in: string; name: string }[] }>> };

  it('has an entry for every route file and method, and none for a route that does not exist', () => {
    expect(files.length).toBeGreaterThan(20);
    const served = new Map(files.map((f) => [servedPath(f), exportedMethods(f)]));
    for (const [path, methods] of served) {
      expect(methods.length, path).toBeGreaterThan(0);
      for (const m of methods) expect(API[path]?.[m as 'get'], `${m.toUpperCase()} ${path} has no entry`).toBeDefined();
    }
    for (const [path, methods] of Object.entries(API)) {
      for (const m of Object.keys(methods)) expect(served.get(path), `${path} is described but no route file serves it`).toContain(m);
    }
  });

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
    expect(API['/api/jobs'].post?.body).toBe(jobSchema);
    const body = (doc.paths['/api/jobs'].post as unknown as { requestBody: { content: Record<string, { schema: unknown }> } }).requestBody.content['application/json'].schema;
    expect(JSON.stringify(body)).toContain('repairOrder');
  });
});
