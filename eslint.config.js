// @ts-check
import eslint from '@eslint/js';
import angular from 'angular-eslint';
import { defineConfig } from 'eslint/config';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default defineConfig(
  {
    ignores: [
      // At any depth: the dealer's example app under docs/examples/ builds into its own folders too.
      '**/dist/',
      'out-tsc/',
      '**/.angular/',
      'data/',
      'test-results/',
      'coverage/',
      'storybook-static/',
      'drizzle/',
    ],
  },
  {
    files: ['**/*.{js,mjs}'],
    extends: [eslint.configs.recommended],
    languageOptions: { globals: globals.node },
  },
  {
    files: ['**/*.ts'],
    extends: [eslint.configs.recommended, tseslint.configs.recommended, tseslint.configs.stylistic],
    rules: {
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      eqeqeq: ['error', 'smart'],
      'no-console': 'off',
    },
  },
  {
    // The engine and the schemas run in the browser and on the server alike: no I/O, no framework.
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['@angular/*', 'express', 'drizzle-orm*', 'better-sqlite3'],
              message: 'shared/ is framework-free.',
            },
            { group: ['node:*', 'fs', 'path', 'os'], message: 'shared/ does no I/O.' },
            { group: ['**/server/**', '**/projects/**'], message: 'shared/ imports neither side.' },
          ],
        },
      ],
      'no-restricted-globals': ['error', 'window', 'document', 'process', 'localStorage', 'fetch'],
    },
  },
  {
    files: ['server/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['@angular/*', '**/projects/**'], message: 'The server never imports Angular.' },
          ],
        },
      ],
    },
  },
  {
    files: ['projects/**/*.ts'],
    extends: [angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/prefer-on-push-component-change-detection': 'error',
      '@angular-eslint/prefer-signals': 'error',
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['**/server/**', 'express', 'drizzle-orm*'],
              message: 'The client never imports the server.',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['projects/counterpoise/**/*.ts'],
    rules: {
      '@angular-eslint/component-selector': ['error', { type: 'element', prefix: 'cp', style: 'kebab-case' }],
      '@angular-eslint/directive-selector': [
        'error',
        { type: 'attribute', prefix: 'cp', style: 'camelCase' },
      ],
      '@angular-eslint/component-class-suffix': 'off',
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: ['**/workbench/**'], message: 'The library never imports the app.' }] },
      ],
    },
  },
  {
    files: ['projects/workbench/**/*.ts'],
    rules: {
      '@angular-eslint/component-selector': [
        'error',
        { type: 'element', prefix: 'app', style: 'kebab-case' },
      ],
      '@angular-eslint/directive-selector': [
        'error',
        { type: 'attribute', prefix: 'app', style: 'camelCase' },
      ],
      '@angular-eslint/component-class-suffix': ['error', { suffixes: ['Page', 'Shell', 'Component', ''] }],
    },
  },
  {
    files: ['projects/**/*.html'],
    extends: [angular.configs.templateRecommended, angular.configs.templateAccessibility],
  },
);
