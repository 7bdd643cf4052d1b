// What one process shares across its module copies: Next.js loads a module once per route bundle, and the HTTP
// server (server/serve.mjs) runs outside them all, so the database client, the engine's threads, the log, the
// caches and the server's lifecycle are kept here, in one object on globalThis, each under its own key.

const shared = (globalThis.__crankprint ??= {});

/** The process's one value under `key`, made by `create` on first use. */
export function processShared(key, create) {
  if (!(key in shared)) shared[key] = create();
  return shared[key];
}
