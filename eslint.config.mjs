import js from '@eslint/js';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['.engine/**', 'node_modules', '.next', '.data', 'samples', 'test-results', 'playwright-report', 'artifacts', 'next-env.d.ts'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.mjs', 'scripts/**'],
    languageOptions: { globals: { process: 'readonly', console: 'readonly', URL: 'readonly', setTimeout: 'readonly', clearTimeout: 'readonly' } },
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_' }],
      '@typescript-eslint/no-non-null-assertion': 'off',
    },
  },
  {
    // Layers: the app, the server, the database and the engine never reach up into scripts/ (the tools around them),
    // and reach the engine only through its public surface (signal/index.ts; the simulator through signal/sim).
    files: ['app/**', 'server/**', 'db/**', 'domain/**', 'components/**', 'workers/**'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['@/scripts/*', '**/scripts/*'], message: 'scripts/ holds the tools around the app; nothing in the app imports it.' },
            { group: ['@/signal/*', '**/signal/*', '!@/signal/sim', '!**/signal/sim', '@/signal/sim/*', '**/signal/sim/*'], message: 'Import the engine from @/signal (its public surface, signal/index.ts), the simulator from @/signal/sim.' },
          ],
        },
      ],
    },
  },
  {
    // Lower layers never import higher ones: the engine nothing of the app, domain/ nothing of db/ or server/,
    // db/ nothing of server/, the app or the components.
    files: ['domain/**'],
    rules: { 'no-restricted-imports': ['error', { patterns: [{ group: ['@/db/*', '@/server/*', '@/app/*', '@/components/*', '@/scripts/*', '@/signal/*', '!@/signal/sim', '@/signal/sim/*'], message: 'domain/ sits above the engine and below everything else.' }] }] },
  },
  {
    files: ['server/**'],
    rules: { 'no-restricted-imports': ['error', { patterns: [{ group: ['@/app/*', '@/components/*', '@/scripts/*', '**/scripts/*', '@/signal/*', '**/signal/*', '!@/signal/sim', '!**/signal/sim', '@/signal/sim/*', '**/signal/sim/*'], message: 'server/ sits below the app and its components, and reaches the engine through @/signal.' }] }] },
  },
  {
    files: ['components/**', 'workers/**'],
    rules: { 'no-restricted-imports': ['error', { patterns: [{ group: ['@/app/*', '@/scripts/*', '**/scripts/*', '@/signal/*', '**/signal/*', '!@/signal/sim', '!**/signal/sim', '@/signal/sim/*', '**/signal/sim/*'], message: 'Shared components and workers sit below the app, and reach the engine through @/signal.' }] }] },
  },
  {
    files: ['db/**'],
    rules: { 'no-restricted-imports': ['error', { patterns: [{ group: ['@/server/*', '@/app/*', '@/components/*', '@/scripts/*', '**/scripts/*', '@/signal/*', '**/signal/*', '!@/signal/sim', '!**/signal/sim', '@/signal/sim/*', '**/signal/sim/*'], message: 'db/ sits below the server and the app.' }] }] },
  },
  {
    // The engine is the lowest layer: pure TypeScript on typed arrays, nothing of Node, React, or any layer above.
    files: ['signal/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['node:*', 'fs', 'path', 'react', 'next/*', '@/*', '**/domain/*', '**/db/*', '**/server/*', '**/app/*', '**/components/*', '**/scripts/*'] }],
    },
  },
);
