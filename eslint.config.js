import { readdirSync } from 'node:fs';
import js from '@eslint/js';
import globals from 'globals';
import tseslint from 'typescript-eslint';

/** Dependency directions: shared is pure; src and server never import each other; features stay apart. */
const restrict = (patterns) => ['error', { patterns }];
const features = readdirSync(new URL('./src/features', import.meta.url), { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);
const clientRules = [
  { group: ['**/server/**', 'express', 'knex', 'better-sqlite3', 'node:*'], message: 'src/ never imports server code.' },
];

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'data/**', 'tmp/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
    },
  },
  {
    files: ['shared/**/*.ts'],
    ignores: ['shared/**/*.test.ts'],
    rules: {
      'no-restricted-imports': restrict([
        { group: ['**/src/**', '**/server/**'], message: 'shared/ is pure domain code: it imports nothing from src/ or server/.' },
        { group: ['node:*', 'fs', 'path', 'http', 'express', 'knex', 'react', 'react-dom', 'better-sqlite3'], message: 'shared/ does no I/O and uses no framework.' },
      ]),
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    rules: { 'no-restricted-imports': restrict(clientRules) },
  },
  ...features.map((feature) => ({
    files: [`src/features/${feature}/**/*.{ts,tsx}`],
    rules: {
      'no-restricted-imports': restrict([
        ...clientRules,
        {
          group: features.filter((f) => f !== feature).map((f) => `**/features/${f}/**`),
          message: 'Features do not import each other; combine them in a route module under src/app/.',
        },
      ]),
    },
  })),
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': restrict([{ group: ['**/src/**', 'react', 'react-dom'], message: 'server/ never imports client code.' }]),
    },
  },
);
