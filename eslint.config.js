// Lint rules that matter here are the import boundaries (see DEVELOPERS.md, "Layers").
import js from '@eslint/js';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const nodeBuiltins = [
  'assert', 'buffer', 'child_process', 'cluster', 'crypto', 'dgram', 'dns', 'events', 'fs', 'fs/promises',
  'http', 'http2', 'https', 'net', 'os', 'path', 'process', 'readline', 'stream', 'tls', 'url', 'util',
  'worker_threads', 'zlib',
];
const ioPackages = ['mysql2', 'mysql2/*', 'typeorm', 'express', 'exceljs', 'nodemailer', 'passport', 'pino', 'react', 'react-dom'];

const restrict = (patterns, paths = []) => ({
  'no-restricted-imports': ['error', { paths, patterns }],
});

export default tseslint.config(
  { ignores: ['node_modules/**', 'dist/**', 'var/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      'no-console': 'off',
    },
  },
  {
    // shared/: pure TypeScript. No other layer, no Node or DOM API, no I/O package.
    files: ['shared/**/*.ts'],
    ignores: ['shared/**/*.test.ts'],
    languageOptions: { globals: {} },
    rules: restrict([
      { group: ['@server/*', '@jobs/*', '@tests/*', '@/*', '**/server/**', '**/client/**', '**/jobs/**', '**/tests/**'], message: 'shared/ imports nothing from the other layers.' },
      { group: ['node:*', ...nodeBuiltins], message: 'shared/ must not use Node APIs (no I/O).' },
      { group: ioPackages, message: 'shared/ must not use I/O or UI packages.' },
    ]),
  },
  {
    files: ['shared/**/*.test.ts'],
    rules: restrict([
      { group: ['@server/*', '@jobs/*', '@/*', '**/server/**', '**/client/**', '**/jobs/**'], message: 'shared/ tests import only shared/ (and test support).' },
    ]),
  },
  {
    // client/: imports only shared/ and itself (plus browser packages).
    files: ['client/src/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    rules: restrict([
      { group: ['@server/*', '@jobs/*', '@tests/*', '**/server/**', '**/jobs/**', '**/tests/**'], message: 'client/ imports only shared/ and itself.' },
      { group: ['node:*', ...nodeBuiltins], message: 'client/ runs in the browser: no Node APIs.' },
      { group: ['mysql2', 'typeorm', 'express', 'exceljs', 'nodemailer', 'passport', 'pino'], message: 'server-only package in client/.' },
    ]),
  },
  {
    files: ['server/**/*.ts'],
    ignores: ['server/setup/**'],
    rules: restrict([
      { group: ['@/*', '**/client/src/**', '@tests/*', '**/tests/**', '@jobs/*', '**/jobs/**'], message: 'server/ does not import client/, tests/ or jobs/ (server/setup/ may start jobs).' },
    ]),
  },
  {
    files: ['jobs/**/*.ts'],
    rules: restrict([
      { group: ['@/*', '**/client/src/**', '@server/routes/*', '**/server/routes/**', '@tests/*'], message: 'jobs/ may use server services, entities and db, never routes or the client.' },
    ]),
  },
);
