/** The API's OpenAPI 3.1 description (server/api/description.ts), generated from the routes' zod schemas. */
import { apiDescription } from '@/server/api/description';
import { APP_URL } from '@/server/auth';

export const dynamic = 'force-dynamic';

export function GET(): Response {
  return Response.json(apiDescription(APP_URL), { headers: { 'cache-control': 'public, max-age=300' } });
}
