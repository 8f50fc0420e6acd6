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
    files: ['**/*.test.ts', '**/*.test.tsx', 'bench/**/*.ts'],
    rules: { '@typescript-eslint/no-non-null-assertion': 'off' },
  },
);
