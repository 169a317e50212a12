// Lint for the whole repository: typescript-eslint everywhere, angular-eslint for the portals and libs/ui.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import angular from 'angular-eslint';

export default tseslint.config(
  { ignores: ['dist/**', '.data/**', '.angular/**', 'node_modules/**', 'coverage/**', 'test/artifacts/**', '**/*.js', '**/*.mjs', '**/*.cjs'] },
  {
    files: ['**/*.ts'],
    extends: [js.configs.recommended, ...tseslint.configs.recommended],
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-console': 'off',
    },
  },
  {
    files: ['apps/client-portal/**/*.ts', 'apps/lab-portal/**/*.ts', 'libs/ui/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/component-selector': ['error', { type: 'element', prefix: 'ohm', style: 'kebab-case' }],
      '@angular-eslint/directive-selector': ['error', { type: 'attribute', prefix: 'ohm', style: 'camelCase' }],
    },
  },
  {
    files: ['apps/client-portal/**/*.html', 'apps/lab-portal/**/*.html', 'libs/ui/**/*.html'],
    extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility],
  },
);
