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
    // Layers: the app, the server, the database and the engine never reach up into scripts/ (the tools around them).
    files: ['app/**', 'server/**', 'db/**', 'domain/**', 'components/**', 'workers/**'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['@/scripts/*', '**/scripts/*'] }],
    },
  },
  {
    files: ['signal/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: ['node:*', 'fs', 'path', 'react', 'next/*'] }],
    },
  },
);
