// @ts-check
/**
 * ESLint for the whole workspace: typescript-eslint's recommended rules everywhere, with the few
 * type-aware rules that catch real async bugs (a promise nobody awaits, a promise where a callback
 * is expected); angular-eslint's recommended and accessibility rules for the web app and its templates.
 * Formatting is Prettier's job (eslint-config-prettier turns off the rules that overlap).
 */
import js from '@eslint/js';
import angular from 'angular-eslint';
import prettier from 'eslint-config-prettier';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', '.data/', '.angular/', 'drizzle/', 'docs/', 'apps/cli/bin/'] },
  {
    files: ['**/*.ts'],
    extends: [js.configs.recommended, ...tseslint.configs.recommended],
    languageOptions: {
      globals: { ...globals.node },
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
    },
    rules: {
      '@typescript-eslint/no-floating-promises': 'error',
      '@typescript-eslint/no-misused-promises': ['error', { checksVoidReturn: { arguments: false, attributes: false } }],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
    },
  },
  {
    files: ['apps/web/src/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    languageOptions: {
      globals: { ...globals.browser },
      // The web app has its own tsconfigs (app and specs) rather than a tsconfig.json the project service would find.
      parserOptions: { projectService: false, project: ['apps/web/tsconfig.app.json', 'apps/web/tsconfig.spec.json'] },
    },
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/component-selector': ['error', { type: 'element', prefix: 'lw', style: 'kebab-case' }],
      '@angular-eslint/directive-selector': ['error', { type: 'attribute', prefix: 'lw', style: 'camelCase' }],
    },
  },
  {
    files: ['apps/web/src/**/*.html'],
    extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility],
  },
  {
    files: ['**/*.js', '**/*.mjs'],
    extends: [js.configs.recommended],
    languageOptions: { globals: { ...globals.node } },
  },
  prettier,
);
