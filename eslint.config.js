import { readdirSync } from 'node:fs';
import js from '@eslint/js';
import globals from 'globals';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import jsxA11y from 'eslint-plugin-jsx-a11y';
import { importX, createNodeResolver } from 'eslint-plugin-import-x';

/** Files that may use devDependencies: tests, test helpers, benchmarks, tools and config files. */
const devFiles = ['**/*.test.{ts,tsx}', 'tests/**', 'src/test-utils/**', 'src/features/*/lib/*-fixture.ts', 'server/db/pg-dev.ts', 'server/db/pg-cluster.ts', '*.config.{ts,js}'];

/** Dependency directions: shared is pure; src and server never import each other; features stay apart. */
const restrict = (patterns) => ['error', { patterns }];
const features = readdirSync(new URL('./src/features', import.meta.url), { withFileTypes: true })
  .filter((d) => d.isDirectory())
  .map((d) => d.name);
const clientRules = [{ group: ['**/server/**', 'express', 'knex', 'better-sqlite3', 'node:*'], message: 'src/ never imports server code.' }];

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'data/**', 'tmp/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { 'import-x': importX },
    settings: {
      'import-x/extensions': ['.ts', '.tsx', '.js', '.mjs'],
      'import-x/parsers': { '@typescript-eslint/parser': ['.ts', '.tsx'] },
      'import-x/resolver-next': [createNodeResolver({ extensions: ['.ts', '.tsx', '.js', '.mjs', '.json'] })],
    },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
      'import-x/no-extraneous-dependencies': ['error', { devDependencies: devFiles, includeTypes: false }],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    ...reactHooks.configs.flat['recommended-latest'],
    // A missing effect dependency is a bug waiting for a stale value, so it fails the lint like the rest.
    rules: { ...reactHooks.configs.flat['recommended-latest'].rules, 'react-hooks/exhaustive-deps': 'error' },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    ...jsxA11y.flatConfigs.recommended,
    rules: {
      ...jsxA11y.flatConfigs.recommended.rules,
      // A choice card is a label around its input and a title and hint in nested spans: look three deep for its text.
      'jsx-a11y/label-has-associated-control': ['error', { depth: 3 }],
      // A wide table scrolls inside a labelled region, which must take keyboard focus to be scrolled without a mouse.
      'jsx-a11y/no-noninteractive-tabindex': ['error', { tags: [], roles: ['tabpanel', 'region'], allowExpressionValues: true }],
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
