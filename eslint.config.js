// Lint for every TypeScript source and the client's templates (flat config). Run by `npm run lint`
// and, through spec/lint.spec.ts, by `npm test`. Rules are the recommended sets of typescript-eslint
// and angular-eslint (without type information, to stay quick on a small machine) plus a few that
// catch mistakes we have made; formatting is prettier's job, not the linter's.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import angular from 'angular-eslint';

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', 'out-tsc/', '.angular/', '.data/', 'spec/.tmp/', 'drizzle/migrations/', 'engine/wasm/assembly/'] },
  {
    files: ['**/*.ts'],
    extends: [js.configs.recommended, ...tseslint.configs.recommended],
    rules: {
      // Comma-operator returns hide a second effect in an expression.
      'no-sequences': 'error',
      eqeqeq: ['error', 'always', { null: 'ignore' }],
      // `_name` marks an argument or binding kept for its position or to drop it from a spread.
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_', caughtErrors: 'none' },
      ],
    },
  },
  {
    // chai's property assertions (`expect(x).to.exist`) are expressions by design.
    files: ['spec/**/*.ts', 'client/src/**/*.spec.ts'],
    rules: { '@typescript-eslint/no-unused-expressions': 'off' },
  },
  {
    files: ['client/src/**/*.ts'],
    extends: [...angular.configs.tsRecommended],
    processor: angular.processInlineTemplates,
    rules: {
      '@angular-eslint/component-selector': ['error', { type: 'element', prefix: 'rn', style: 'kebab-case' }],
      '@angular-eslint/directive-selector': ['error', { type: 'attribute', prefix: 'rn', style: 'camelCase' }],
    },
  },
  {
    files: ['client/src/**/*.html'],
    extends: [...angular.configs.templateRecommended, ...angular.configs.templateAccessibility],
  },
);
