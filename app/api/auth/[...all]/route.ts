/** better-auth's own endpoints: sign-up, sign-in, sign-out, e-mail verification, password reset, session, invitations. */
import { beginWork } from '@/db/client';
import { getAuth } from '@/server/auth';

async function handle(req: Request): Promise<Response> {
  const done = beginWork();
  try {
    const auth = await getAuth();
    return await auth.handler(req);
  } finally {
    done();
  }
}

export { handle as GET, handle as POST };
