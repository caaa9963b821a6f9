// Lint rules: the recommended sets, plus the layering rules of DEVELOPERS.md (client never imports
// server; policies import neither; the framework-free core — commands, queries, services — never
// imports express or the HTTP layer; routers never touch the ORM).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['**/dist/**', 'node_modules/**', '.data/**', 'test-results/**', 'playwright-report/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-explicit-any': 'off',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-console': 'off',
    },
  },
  {
    files: ['client/src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/server/**'], message: 'The client never imports server code.' }] }],
    },
  },
  {
    files: ['policies/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['**/server/**', '**/client/**'], message: 'policies/ imports neither server nor client.' },
            { group: ['node:*', 'pg', 'typeorm', 'express'], message: 'policies/ is free of I/O.' },
          ],
        },
      ],
    },
  },
  {
    files: ['server/src/core/**/*.ts', 'server/src/commands/**/*.ts', 'server/src/queries/**/*.ts', 'server/src/services/**/*.ts'],
    ignores: ['**/*.test.ts'],
    rules: {
      'no-restricted-imports': [
        'warn',
        {
          patterns: [
            {
              group: ['express', 'express-*', 'passport', 'passport-*', 'supertest'],
              message: 'The core (commands, queries, services) is framework-free: no express, no request.',
            },
            {
              group: ['**/http/**', '**/http', '**/routes/**'],
              message: 'The core never imports the HTTP layer; move what it needs into server/src/core.',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['server/src/routes/**/*.router.ts'],
    rules: {
      'no-restricted-imports': [
        'warn',
        {
          patterns: [
            {
              group: ['typeorm', '**/entities', '**/entities/**'],
              message:
                'Routers parse, call one command or query, and shape the response: data access lives in server/src/commands and server/src/queries.',
            },
          ],
        },
      ],
    },
  },
);
