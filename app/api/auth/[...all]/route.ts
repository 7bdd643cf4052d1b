/** better-auth's own endpoints: sign-up, sign-in, sign-out, e-mail verification, password reset, session, invitations. */
import { getAuth } from '@/server/auth';

async function handle(req: Request): Promise<Response> {
  const auth = await getAuth();
  return auth.handler(req);
}

export { handle as GET, handle as POST };
