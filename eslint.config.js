// The lint gate (run by docker-free-local/test.sh): TypeScript's recommended rules, the React hooks
// rules, and the project's import boundaries (tools/eslint/boundaries.js).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import { boundariesPlugin } from './tools/eslint/boundaries.js';

export default tseslint.config(
  {
    ignores: [
      'dist/**',
      'node_modules/**',
      '.local/**',
      'coverage/**',
      'screenshots/**',
      'fixtures/**',
      'tests/fixtures/lint/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx,js,mjs}'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { sigmaline: boundariesPlugin },
    rules: {
      'sigmaline/boundaries': 'error',
      '@typescript-eslint/no-unused-expressions': ['error', { allowShortCircuit: true, allowTernary: true }],
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' },
      ],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'error' },
  },
);
