// @ts-check
import { defineConfig } from 'eslint/config';
import tseslint from 'typescript-eslint';
import angular from 'angular-eslint';
import prettier from 'eslint-config-prettier';

export default defineConfig(
  {
    ignores: ['dist/**', 'out-tsc/**', '.angular/**', 'node_modules/**', 'coverage/**', '.data/**', 'test-results/**'],
  },
  {
    files: ['**/*.ts'],
    extends: [...tseslint.configs.strictTypeChecked, ...tseslint.configs.stylisticTypeChecked],
    languageOptions: {
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
    },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      // Conflicts with noPropertyAccessFromIndexSignature, which asks for ['key'] on index signatures.
      '@typescript-eslint/dot-notation': 'off',
      '@typescript-eslint/no-confusing-void-expression': 'off',
      '@typescript-eslint/restrict-template-expressions': ['error', { allowNumber: true }],
      // Express 5 handlers are async by design: a rejected promise goes to the error handler.
      '@typescript-eslint/no-misused-promises': ['error', { checksVoidReturn: { arguments: false } }],
    },
  },
  {
    // Tests read loosely typed JSON answers; assertions do the checking.
    files: ['tests/**/*.ts', 'e2e/**/*.ts', 'src/**/*.spec.ts'],
    rules: {
      '@typescript-eslint/no-unsafe-member-access': 'off',
      '@typescript-eslint/no-unsafe-assignment': 'off',
      '@typescript-eslint/no-unsafe-argument': 'off',
      '@typescript-eslint/no-unsafe-call': 'off',
      '@typescript-eslint/no-non-null-assertion': 'off',
      '@typescript-eslint/no-floating-promises': 'off',
      '@typescript-eslint/no-unnecessary-condition': 'off',
    },
  },
  {
    files: ['src/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/component-selector': ['error', { type: 'element', prefix: 'app', style: 'kebab-case' }],
      '@angular-eslint/directive-selector': ['error', { type: 'attribute', prefix: 'app', style: 'camelCase' }],
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            { group: ['**/server/**', 'express', 'knex', 'pg'], message: 'The client cannot import server code.' },
          ],
        },
      ],
      // Angular's static validators (Validators.required…) are meant to be passed unbound.
      '@typescript-eslint/unbound-method': 'off',
      // Material's config classes (MatDialogConfig, MatSnackBarConfig) are documented to take object literals.
      '@typescript-eslint/no-unsafe-class-instance-assignment': 'off',
      // Routed components without logic are classes with only a decorator.
      '@typescript-eslint/no-extraneous-class': ['error', { allowWithDecorator: true }],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['@angular/*', 'express', 'knex', 'pg', '**/server/**', '**/src/**'],
              message: 'shared/ stays framework-free.',
            },
          ],
        },
      ],
    },
  },
  {
    // A router parses, authorises, calls its area's service and responds: it never touches the
    // database itself (docs/architecture.md#layers-of-a-server-module).
    files: ['server/modules/**/*-router.ts'],
    rules: {
      '@typescript-eslint/no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: ['knex', 'pg'],
              allowTypeImports: true,
              message: 'A router does not query the database: call a service.',
            },
            { group: ['**/db', '**/db.js'], message: 'A router does not query the database: call a service.' },
            {
              group: ['**/*-repo', '**/*-repo.js'],
              allowTypeImports: true,
              message: 'A router calls services; only services call repositories.',
            },
          ],
        },
      ],
      'no-restricted-syntax': [
        'error',
        {
          selector: 'CallExpression[callee.name=/^(db|trx|knex|conn)$/]',
          message: 'A router does not query the database: call a service.',
        },
        {
          selector:
            'MemberExpression[object.name=/^(db|trx|knex|conn)$/][property.name=/^(transaction|raw|fn|select|from|insert|update|delete|schema)$/]',
          message: 'A router does not query the database: call a service.',
        },
      ],
    },
  },
  {
    files: ['src/**/*.html'],
    extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility],
  },
  prettier,
);
