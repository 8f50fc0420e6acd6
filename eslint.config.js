import js from '@eslint/js';
import globals from 'globals';
import reactHooks from 'eslint-plugin-react-hooks';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['**/node_modules/**', '**/dist/**', 'sdk/src/generated/**', 'data/**', 'coverage/**', 'docs/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node }, ecmaVersion: 2023, sourceType: 'module' },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'error',
      'no-console': 'off',
    },
  },
  {
    // The analysis module is pure: no framework, database, file system, config or logger imports.
    files: ['api/src/analysis/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['express', 'express/*', 'sequelize', 'sqlite3', 'pg', 'pino', 'pino-*', 'zod'], message: 'analysis code is pure: no frameworks or I/O' },
            { group: ['node:*', 'fs', 'path', 'http', 'os', 'child_process'], message: 'analysis code is pure: no Node I/O modules' },
            { group: ['../../*/**', '!../../analysis/**'], message: 'analysis code imports only other analysis files' },
          ],
        },
      ],
    },
  },
  {
    files: ['dashboard/src/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: { ...reactHooks.configs.recommended.rules },
  },
  {
    // Dashboard layering (bulletproof-react): shared code (components, lib) never imports features or the
    // app; a feature never imports another feature or the app. Pages in app/ compose features.
    files: ['dashboard/src/components/**/*.{ts,tsx}', 'dashboard/src/lib/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['**/features/**', '**/app/**'], message: 'shared code imports no feature and no page' }] }],
    },
  },
  {
    files: ['dashboard/src/features/*/*/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['../../*/**', '!../../../**'], message: 'a feature never imports another feature; compose them in app/routes' },
            { group: ['**/app/**'], message: 'features import no page' },
          ],
        },
      ],
    },
  },
  {
    files: ['**/*.test.ts', '**/*.test.tsx', 'bench/**/*.ts'],
    rules: { '@typescript-eslint/no-non-null-assertion': 'off' },
  },
);
