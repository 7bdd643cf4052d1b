/**
 * better-auth for sign-in, e-mail verification, password reset and sessions; its organization plugin is the
 * shop, with the roles of server/permissions.ts. Built lazily on the one database client.
 */
import 'server-only';
import { betterAuth } from 'better-auth';
import { drizzleAdapter } from 'better-auth/adapters/drizzle';
import { nextCookies } from 'better-auth/next-js';
import { organization } from 'better-auth/plugins';
import { getDb } from '@/db/client';
import * as schema from '@/db/schema';
import { recordAudit } from '@/db/queries/audit';
import { authLogLine, log, safeError } from './log';
import { sendMail } from './mail';
import { CLIENT_HEADER } from '@/server/client-address.mjs';
import { ac, roles } from './permissions';
import { processShared } from '@/db/process-state.mjs';

export const APP_URL = process.env.BETTER_AUTH_URL || 'http://127.0.0.1:3000';

/** Shop management goes through Crankprint's own routes (session, role, input, audit); these stay server-side. */
const SERVER_ONLY_PATHS = [
  '/organization/create',
  '/organization/update',
  '/organization/delete',
  '/organization/invite-member',
  '/organization/cancel-invitation',
  '/organization/remove-member',
  '/organization/update-member-role',
  '/organization/leave',
  '/organization/add-member',
];

/** Loopback http is the only place cookies may travel without TLS (a trial or test on this machine). */
const LOOPBACK = /^http:\/\/(127\.0\.0\.1|localhost|\[::1\])(:\d+)?\/?$/;
const SECURE_COOKIES = APP_URL.startsWith('https:') || (process.env.NODE_ENV === 'production' && !LOOPBACK.test(APP_URL));
if (SECURE_COOKIES && !APP_URL.startsWith('https:')) {
  log.warn(`BETTER_AUTH_URL is ${APP_URL}: sign-in cookies are marked Secure in production and browsers send them only over HTTPS; serve Crankprint over HTTPS.`);
}

function build(db: Awaited<ReturnType<typeof getDb>>) {
  return betterAuth({
    // Counted per client and purpose in the auth route (server/rate-limit.ts), shared across instances.
    rateLimit: { enabled: false },
    appName: 'Crankprint',
    // Its lines go through our log as JSON, with the request id (server/log.ts).
    logger: { level: 'warn', log: authLogLine },
    baseURL: APP_URL,
    secret: process.env.BETTER_AUTH_SECRET,
    database: drizzleAdapter(db, { provider: 'pg', schema, usePlural: true }),
    disabledPaths: SERVER_ONLY_PATHS,
    trustedOrigins: [APP_URL],
    advanced: {
      // On everywhere, tests included (better-auth would skip them under a test runner).
      disableOriginCheck: false,
      disableCSRFCheck: false,
      useSecureCookies: SECURE_COOKIES,
      cookiePrefix: 'crankprint',
      // The address the server took from the socket or its trusted proxies (server/serve.mjs).
      ipAddress: { ipAddressHeaders: [CLIENT_HEADER] },
    },
    emailAndPassword: {
      enabled: true,
      requireEmailVerification: true,
      minPasswordLength: 10,
      revokeSessionsOnPasswordReset: true,
      // Not awaited: the answer must not take longer for an account that exists (see the auth route's floor).
      sendResetPassword: async ({ user, url }) => {
        void sendMailLogged({
          to: user.email,
          subject: 'Reset your Crankprint password',
          text: `Someone asked to reset the password for ${user.email}. If it was you, open this link within an hour:\n${url}\nIf it was not you, ignore this message.`,
        });
      },
    },
    emailVerification: {
      sendOnSignUp: true,
      autoSignInAfterVerification: true,
      sendVerificationEmail: async ({ user, url }) => {
        await sendMail({
          to: user.email,
          subject: 'Confirm your e-mail for Crankprint',
          text: `Welcome to Crankprint, ${user.name}. Confirm your e-mail address to sign in:\n${url}`,
        });
      },
    },
    // Every request looks its session up (no cookie cache): a sign-out, a password reset or a revoked session
    // ends a copied cookie at once. Shop membership and role are remembered for a few seconds per instance
    // (server/membership-cache.ts) and forgotten on every instance as soon as a member, role or shop changes
    // (db/changes.ts), so removing a member takes effect at once too.
    session: { expiresIn: 60 * 60 * 24 * 7, updateAge: 60 * 60 * 24, cookieCache: { enabled: false } },
    databaseHooks: {
      session: {
        create: {
          // Every sign-in lands in the audit log (no shop yet: a user may belong to several).
          after: async (session) => {
            await recordAudit(null, session.userId, 'auth.sign-in', { type: 'session', id: session.id }, { ip: session.ipAddress ?? null, userAgent: session.userAgent ?? null });
          },
        },
      },
    },
    plugins: [
      organization({
        ac,
        roles,
        creatorRole: 'owner',
        allowUserToCreateOrganization: true,
        invitationExpiresIn: 60 * 60 * 24 * 7,
        sendInvitationEmail: async ({ id, email, role, organization: shop, inviter }) => {
          await sendMail({
            to: email,
            subject: `Join ${shop.name} on Crankprint`,
            text: `${inviter.user.name} invites you to ${shop.name} on Crankprint as ${role}.\nOpen this link to accept:\n${APP_URL}/invite/${id}`,
          });
        },
      }),
      nextCookies(),
    ],
  });
}

/** Sends a message without the caller waiting; a failure is logged (without the message's link). */
function sendMailLogged(message: Parameters<typeof sendMail>[0]): Promise<void> {
  return sendMail(message).then(
    () => undefined,
    (e: unknown) => log.warn({ err: safeError(e), subject: message.subject }, 'mail not sent'),
  );
}

export type Auth = ReturnType<typeof build>;

const g = processShared<{ auth?: Promise<Auth> }>('auth', () => ({}));

/** The process's better-auth instance, built once the database is open. */
export function getAuth(): Promise<Auth> {
  g.auth ??= getDb().then(build);
  return g.auth;
}
