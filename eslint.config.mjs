import js from '@eslint/js';
import tseslint from 'typescript-eslint';

/** The tools around the app, which no layer of it imports. */
const SCRIPTS = ['@/scripts/*', '**/scripts/*'];
/** The engine past its public surface (signal/index.ts), and the simulator past signal/sim. */
const ENGINE_INSIDES = ['@/signal/*', '**/signal/*', '!@/signal/sim', '!**/signal/sim', '@/signal/sim/*', '**/signal/sim/*'];

/**
 * A layer fenced off the layers `above` it. Flat config replaces a rule per file rather than merging it, so each
 * fence carries the fences every layer has (scripts/ and the engine's insides) too.
 */
function fence(files, above, message) {
  return { files, rules: { 'no-restricted-imports': ['error', { patterns: [{ group: [...above, ...SCRIPTS, ...ENGINE_INSIDES], message }] }] } };
}

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
            { group: SCRIPTS, message: 'scripts/ holds the tools around the app; nothing in the app imports it.' },
            { group: ENGINE_INSIDES, message: 'Import the engine from @/signal (its public surface, signal/index.ts), the simulator from @/signal/sim.' },
          ],
        },
      ],
    },
  },
  // Lower layers never import higher ones: the engine nothing of the app, domain/ nothing of db/ or server/,
  // db/ nothing of server/, the app or the components.
  fence(['domain/**'], ['@/db/*', '@/server/*', '@/app/*', '@/components/*'], 'domain/ sits above the engine and below everything else.'),
  fence(['server/**'], ['@/app/*', '@/components/*'], 'server/ sits below the app and its components, and reaches the engine through @/signal.'),
  fence(['components/**', 'workers/**'], ['@/app/*'], 'Shared components and workers sit below the app, and reach the engine through @/signal.'),
  fence(['db/**'], ['@/server/*', '@/app/*', '@/components/*'], 'db/ sits below the server and the app.'),
  {
    // The engine is the lowest layer: pure TypeScript on typed arrays, nothing of Node, React, or any layer above.
    files: ['signal/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['node:*', 'fs', 'path', 'react', 'next/*', '@/*', '**/domain/*', '**/db/*', '**/server/*', '**/app/*', '**/components/*', '**/scripts/*'] }],
    },
  },
);
