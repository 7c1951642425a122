// ESLint 9 flat config: JavaScript and TypeScript recommendations everywhere, React hooks and
// accessibility rules for the client. Import boundaries are checked separately by
// tests/support/check-imports.ts (both run by `npm run lint`).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import jsxA11y from 'eslint-plugin-jsx-a11y';
import comments from '@eslint-community/eslint-plugin-eslint-comments/configs';
import globals from 'globals';

export default tseslint.config(
  { ignores: ['dist/', 'data/', 'node_modules/', 'coverage/', 'reports/', '.stryker-tmp/', 'drizzle/', 'public/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  comments.recommended,
  {
    languageOptions: { ecmaVersion: 2023, sourceType: 'module', globals: { ...globals.node } },
    rules: {
      // Unused names: the type check refuses unused locals; arguments and caught errors named with a
      // leading underscore are kept on purpose (Express error handlers need four parameters).
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' }],
      // Every disable comment says why, after "--" on the same line.
      '@eslint-community/eslint-comments/require-description': ['error', { ignore: [] }],
      '@eslint-community/eslint-comments/no-unused-disable': 'error',
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs['recommended-latest'].rules,
      // These two report only what React Compiler would skip; Lugbook does not build with the
      // compiler, and react-hook-form, TanStack Table and TanStack Virtual are used as documented.
      'react-hooks/incompatible-library': 'off',
      'react-hooks/preserve-manual-memoization': 'off',
    },
  },
  {
    files: ['src/**/*.tsx'],
    ...jsxA11y.flatConfigs.recommended,
    rules: {
      ...jsxA11y.flatConfigs.recommended.rules,
      // Focus moves to the first field only on screens whose one job is that form (sign-in, the
      // bench's scan-and-read entry, a confirmation): what the person came to do, announced by the
      // field's label.
      'jsx-a11y/no-autofocus': 'off',
      // A scrolling table is a focusable labelled region, so keyboard users can scroll it.
      'jsx-a11y/no-noninteractive-tabindex': ['error', { tags: [], roles: ['tabpanel', 'region'], allowExpressionValues: true }],
    },
  },
);
