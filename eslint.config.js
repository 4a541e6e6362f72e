import js from '@eslint/js';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';
import ts from 'typescript-eslint';
import svelteConfig from './svelte.config.js';

/** Imports the pure lint library must never use: it runs in the server, the browser and the CLI alike. */
const impureImports = {
  patterns: [
    {
      group: ['node:*', 'fs', 'path', 'os', 'crypto', 'child_process'],
      message: 'src/lib/lint is pure: I/O comes in from the caller.'
    },
    {
      group: ['$app/*', '$env/*', '$lib/server/*', 'sequelize', 'svelte', 'svelte/*'],
      message: 'src/lib/lint has no Svelte, SvelteKit or database imports.'
    }
  ]
};

export default ts.config(
  js.configs.recommended,
  ...ts.configs.recommended,
  ...svelte.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } }
  },
  {
    files: ['**/*.svelte', '**/*.svelte.ts', '**/*.svelte.js'],
    languageOptions: {
      parserOptions: { projectService: true, extraFileExtensions: ['.svelte'], parser: ts.parser, svelteConfig }
    }
  },
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-empty': ['error', { allowEmptyCatch: false }]
    }
  },
  {
    files: ['src/lib/lint/**/*.ts'],
    ignores: ['src/lib/lint/**/*.test.ts'],
    rules: { 'no-restricted-imports': ['error', impureImports] }
  },
  {
    ignores: [
      'build/',
      '.svelte-kit/',
      'cli/dist/',
      'node_modules/',
      'data/',
      'test-results/',
      'playwright-report/',
      'bench-output/'
    ]
  }
);
