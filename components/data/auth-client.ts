'use client';
/** better-auth's client for the browser, with the organization (shop) plugin. */
import { organizationClient } from 'better-auth/client/plugins';
import { createAuthClient } from 'better-auth/react';

export const authClient = createAuthClient({ plugins: [organizationClient()] });
