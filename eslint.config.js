// ESLint (flat config): the TypeScript and React-hooks rules, and the import boundaries that keep the
// architecture visible — the engine imports nothing from the client, the server or Node; shared UI
// does not import the app or the features; the server does not import the client.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

const NODE_BUILTINS = ['node:*', 'fs', 'path', 'os', 'crypto', 'child_process', 'http', 'https', 'net', 'url', 'worker_threads', 'stream', 'zlib'];

export default tseslint.config(
  {
    ignores: ['dist/**', 'dist-cli/**', 'node_modules/**', 'e2e-output/**', 'bench-output/**', '.data/**', '.tmp/**', 'coverage/**', '**/*.json'],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    linterOptions: { reportUnusedDisableDirectives: 'error' },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      // A deliberately ignored failure (best-effort cleanup) is an empty catch; other empty blocks are not.
      'no-empty': ['error', { allowEmptyCatch: true }],
      // Input guards match control characters on purpose (NUL bytes, C0 controls in uploads and JSON).
      'no-control-regex': 'off',
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'error',
    },
  },
  {
    // Tests throw assertion errors of their own and write absurd literals on purpose (fuzzing).
    files: ['tests/**/*.{ts,tsx}', 'e2e/**/*.ts'],
    rules: { 'preserve-caught-error': 'off', 'no-loss-of-precision': 'off' },
  },
  {
    // The engine is pure: no React, no DOM, no server, no database, no Node I/O.
    files: ['src/engine/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['react', 'react-dom', 'react-*', '@tanstack/*', 'express', 'express-*', 'knex', 'pg', 'nodemailer', 'pdf-lib', ...NODE_BUILTINS],
              message: 'src/engine is pure: no UI, server, database or Node I/O.',
            },
            {
              group: ['**/server/**', '**/features/**', '**/components/**', '**/app/**', '**/lib/**', '**/shared/**'],
              message: 'src/engine imports nothing from the client or the server.',
            },
          ],
        },
      ],
    },
  },
  {
    // Shared UI pieces and the API client serve the features; they do not reach into them or the app.
    files: ['src/components/**/*.{ts,tsx}', 'src/lib/**/*.{ts,tsx}', 'src/shared/**/*.ts'],
    rules: {
      // The route-path table (app/paths) is the one place addresses are written; shared pages may link with it.
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['**/features/**', '**/app/*', '!**/app/paths', '**/server/**'], message: 'Shared code does not import features, the app or the server.' },
          ],
        },
      ],
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['**/src/features/**', '**/src/components/**', '**/src/app/**', 'react', 'react-dom'],
              message: 'The server imports the engine and the shared API contract only.',
            },
          ],
        },
      ],
    },
  },
  {
    // Services and repositories know nothing of HTTP: no request, response or status; they throw
    // ServiceError (server/services/errors.ts) and the HTTP layer maps its code to a status.
    files: ['server/services/**/*.ts', 'server/repositories/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['**/src/features/**', '**/src/components/**', '**/src/app/**', 'react', 'react-dom'],
              message: 'The server imports the engine and the shared API contract only.',
            },
            {
              group: ['**/http/**', '../http/*', 'express', 'express-*', 'multer'],
              message: 'Services and repositories know nothing of HTTP: throw ServiceError (server/services/errors.ts).',
            },
          ],
        },
      ],
    },
  },
);
