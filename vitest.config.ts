import { defineConfig } from 'vitest/config';

export default defineConfig({
  resolve: { alias: { '@': new URL('./', import.meta.url).pathname, 'server-only': new URL('./tests/support/empty.ts', import.meta.url).pathname } },
  test: {
    include: ['tests/**/*.test.ts'],
    setupFiles: ['tests/support/pg-database.ts'],
    testTimeout: 60_000,
    pool: 'forks',
  },
});
