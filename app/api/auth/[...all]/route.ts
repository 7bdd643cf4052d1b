/**
 * better-auth's own endpoints: sign-up, sign-in, sign-out, e-mail verification, password reset, session,
 * invitations. Their bodies are read here with the JSON limit while they stream, then handed on.
 */
import { beginWork } from '@/db/client';
import { getAuth } from '@/server/auth';
import { errorResponse, HttpError } from '@/server/http';
import { readLimited } from '@/server/request-body';

async function handle(req: Request): Promise<Response> {
  const done = beginWork();
  try {
    let forward = req;
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      const body = await readLimited(req);
      forward = new Request(req.url, { method: req.method, headers: req.headers, body: body as unknown as BodyInit, signal: req.signal });
    }
    const auth = await getAuth();
    return await auth.handler(forward);
  } catch (e) {
    if (e instanceof HttpError) return errorResponse(e);
    throw e;
  } finally {
    done();
  }
}

export { handle as GET, handle as POST };
