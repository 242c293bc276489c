// Lint rules for the whole tree: TypeScript, React and hooks; Prettier owns formatting.
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import react from 'eslint-plugin-react';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  {
    ignores: [
      'node_modules',
      'dist',
      '.build',
      '.data',
      '.tmp',
      '.expo',
      'test-results',
      'db/migrations',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx,mts}'],
    plugins: { react, 'react-hooks': reactHooks },
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    settings: { react: { version: 'detect' } },
    rules: {
      ...react.configs.recommended.rules,
      ...react.configs['jsx-runtime'].rules,
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
      'react/prop-types': 'off',
      '@typescript-eslint/consistent-type-imports': 'error',
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', ignoreRestSiblings: true },
      ],
    },
  },
  // The layers, one rule per folder: an import that runs backwards fails `npm test`.
  {
    // ingest/ is shared with the app and must stay free of Node, React, database and our other
    // folders' imports: it imports zod and itself only.
    files: ['ingest/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            'node:*',
            'react*',
            'express',
            'pg',
            'drizzle-orm*',
            '@/server*',
            '@/db*',
            '@/components*',
            '@/app*',
            '@/scripts*',
            '@/tests*',
          ],
        },
      ],
    },
  },
  {
    // The web app talks to the server over HTTP only; server and database code would drag Node
    // into the bundle and blur who decides what the API answers.
    files: ['components/**/*.{ts,tsx}', 'app/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            '@/server*',
            '@/db*',
            '@/scripts*',
            '@/tests*',
            '**/server/*',
            '**/db/*',
            'node:*',
            'pg',
            'express',
          ],
        },
      ],
    },
  },
  {
    // db/ stores and reads; it never calls back into the server or the app.
    files: ['db/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            '@/server*',
            '@/components*',
            '@/app*',
            '@/scripts*',
            '@/tests*',
            '**/server/*',
          ],
        },
      ],
    },
  },
  {
    // The server is a library for scripts/ and tests/, never the other way round.
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: ['@/components*', '@/app*', '@/scripts*', '@/tests*'] },
      ],
    },
  },
  {
    // Metro's configuration is CommonJS run by Node.
    files: ['metro.config.js'],
    languageOptions: { sourceType: 'commonjs', globals: globals.node },
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  prettier,
);
