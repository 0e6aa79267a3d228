// ESLint: correctness and the boundaries between the layers, nothing about style (Prettier owns
// style: .prettierrc.json, `npm run format`). `npm run lint` runs it; `npm test` runs it.
// No rule here fights Prettier (checked with `npx eslint-config-prettier server/app.ts src/App.vue`;
// only the correctness rule no-unexpected-multiline is listed, and it stays), so
// eslint-config-prettier is not needed; add it last should a stylistic rule set come in.
//
// The boundaries (see DEVELOPERS.md, "Layers"):
//   shared/            imports only shared/ and zod — no server, client, Node or DOM code
//   server/services/   no express, multer, middleware or routes (services take plain values)
//   server/storage/, server/mail/   adapters: no routes, no middleware
//   everywhere         no import cycles
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import pluginVue from 'eslint-plugin-vue';
import vueParser from 'vue-eslint-parser';
import { importX } from 'eslint-plugin-import-x';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import globals from 'globals';

const nodeBuiltins = [
  'node:*',
  'fs',
  'path',
  'os',
  'crypto',
  'http',
  'https',
  'net',
  'url',
  'stream',
  'child_process',
  'events',
  'util',
  'buffer',
  'zlib',
  'module',
  'worker_threads',
];

export default tseslint.config(
  { ignores: ['dist/**', '.data/**', 'node_modules/**', 'public/**', '**/*.d.ts'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...pluginVue.configs['flat/essential'],
  {
    files: ['**/*.vue'],
    languageOptions: {
      parser: vueParser,
      parserOptions: { parser: tseslint.parser, extraFileExtensions: ['.vue'], sourceType: 'module' },
    },
  },
  {
    languageOptions: {
      ecmaVersion: 2022,
      sourceType: 'module',
      globals: { ...globals.node, ...globals.browser },
      // Also used when import-x parses a .vue file that a .ts file imports (its <script lang="ts">).
      parserOptions: { parser: tseslint.parser, extraFileExtensions: ['.vue'] },
    },
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createTypeScriptImportResolver({ project: './tsconfig.json', alwaysTryTypes: true })],
      'import-x/extensions': ['.ts', '.vue', '.js', '.mjs'],
      // Imported files are parsed by the parser of their kind (a .vue file by vue-eslint-parser).
      'import-x/parsers': { 'vue-eslint-parser': ['.vue'], '@typescript-eslint/parser': ['.ts'] },
    },
    rules: {
      // Correctness only: these recommended rules are about taste, or TypeScript checks them already.
      '@typescript-eslint/no-explicit-any': 'off',
      // Warnings, not errors: unused code is worth a look but never breaks the build.
      '@typescript-eslint/no-unused-vars': [
        'warn',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none', ignoreRestSiblings: true },
      ],
      '@typescript-eslint/no-non-null-assertion': 'off',
      '@typescript-eslint/no-empty-object-type': 'off',
      '@typescript-eslint/no-unused-expressions': ['warn', { allowShortCircuit: true, allowTernary: true }],
      'no-undef': 'off',
      'vue/multi-word-component-names': 'off',
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            { target: './shared', from: './server', message: 'shared/ is pure: it may not import server code.' },
            { target: './shared', from: './src', message: 'shared/ is pure: it may not import client code.' },
            { target: './shared', from: './tests', message: 'shared/ is pure: it may not import test code.' },
            { target: './shared', from: './scripts', message: 'shared/ is pure: it may not import scripts.' },
          ],
        },
      ],
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: nodeBuiltins, message: 'shared/ runs in the browser too: no Node modules.' },
            { group: ['@/*', '@/**'], message: 'shared/ may not import client code.' },
          ],
        },
      ],
    },
  },
  {
    files: ['server/services/**/*.ts'],
    rules: {
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            {
              target: './server/services',
              from: './server/routes',
              message: 'A service may not import a route: routes call services, not the other way round.',
            },
            {
              target: './server/services',
              from: './server/middleware',
              message: 'A service may not import middleware: take plain values, not req/res.',
            },
          ],
        },
      ],
      'no-restricted-imports': [
        'error',
        {
          paths: [
            { name: 'express', message: 'A service takes plain values, not req/res: keep express in the routes.' },
            { name: 'multer', message: 'Uploads are parsed in the route (or middleware), not in a service.' },
          ],
        },
      ],
    },
  },
  {
    files: ['server/storage/**/*.ts', 'server/mail/**/*.ts'],
    rules: {
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            {
              target: ['./server/storage', './server/mail'],
              from: './server/routes',
              message: 'An adapter may not import a route.',
            },
            {
              target: ['./server/storage', './server/mail'],
              from: './server/middleware',
              message: 'An adapter may not import middleware.',
            },
          ],
        },
      ],
    },
  },
);
