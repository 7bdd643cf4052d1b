/** Every route's contract (server/api/contract.ts): the OpenAPI document, the role matrix and the route test walk this list. */
import type { RouteContract } from '../contract';
import * as captures from './captures';
import * as catalog from './catalog';
import * as jobs from './jobs';
import * as reports from './reports';
import * as shop from './shop';
import * as system from './system';

export const ROUTES: RouteContract[] = [system, jobs, captures, reports, catalog, shop].flatMap((group) => Object.values(group) as RouteContract[]);

/** A contract by method and path, e.g. ('GET', '/api/jobs/{jobId}'). */
export function contractAt(method: string, path: string): RouteContract | undefined {
  return ROUTES.find((c) => c.method === method && c.path === path);
}
