// ESLint (flat config). `npm run lint` runs it with Prettier's check; `npm test` runs lint first.
// Rules turned off or down carry their reason on the same line.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import astro from 'eslint-plugin-astro';
import reactHooks from 'eslint-plugin-react-hooks';
import jsxA11y from 'eslint-plugin-jsx-a11y';
import globals from 'globals';

export default tseslint.config(
  {
    ignores: [
      'node_modules/',
      'dist/',
      'dist-*/',
      'data/',
      '.data*/',
      '.astro/',
      'drizzle/',
      'test-results/',
      'playwright-report/',
      'e2e/screenshots/',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...astro.configs['flat/recommended'],
  ...astro.configs['flat/jsx-a11y-recommended'],
  {
    // The plugin object itself, not flatConfigs' copy: the Astro a11y config above registers it too.
    files: ['**/*.tsx'],
    plugins: { 'jsx-a11y': jsxA11y },
    languageOptions: jsxA11y.flatConfigs.recommended.languageOptions,
    rules: {
      ...jsxA11y.flatConfigs.recommended.rules,
      // A label's words may sit a level deeper than the default 2 (a title and a hint, each in its own span).
      'jsx-a11y/label-has-associated-control': ['error', { depth: 3 }],
    },
  },
  {
    files: ['**/*.tsx', 'src/components/**/*.ts'],
    ...reactHooks.configs.flat.recommended,
    rules: {
      ...reactHooks.configs.flat.recommended.rules,
      'react-hooks/exhaustive-deps': 'error',
      // The four below judge code for the React Compiler, which this project does not run; refs read
      // during render (latest-value refs, the per-island store) and tables from @tanstack/react-table are deliberate.
      'react-hooks/refs': 'off',
      'react-hooks/immutability': 'off',
      'react-hooks/set-state-in-effect': 'off',
      'react-hooks/incompatible-library': 'off',
    },
  },
  {
    languageOptions: { globals: { ...globals.node } },
  },
  {
    // Islands and page scripts run in the browser; so do the functions bench/editor-drop.mjs and bench/js-size.mjs hand to the page.
    files: ['src/**/*.{ts,tsx,astro}', 'bench/editor-drop.mjs', 'bench/js-size.mjs'],
    languageOptions: { globals: { ...globals.browser } },
  },
  {
    rules: {
      // Names starting with _ are kept on purpose (a parameter a signature needs, a rest-sibling omit).
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_', ignoreRestSiblings: true },
      ],
      // Scrollable regions (.table-wrap, panels that scroll) take tabindex="0" so a keyboard can scroll them,
      // as axe's scrollable-region-focusable asks in the browser tests; this rule cannot tell them apart.
      'jsx-a11y/no-noninteractive-tabindex': 'off',
      'astro/jsx-a11y/no-noninteractive-tabindex': 'off',
      // "Photo 1 of …" tells a photo of the part from the drawings of it; a screen reader says "image" for both.
      'jsx-a11y/img-redundant-alt': 'off',
      'astro/jsx-a11y/img-redundant-alt': 'off',
      // In .astro a label's words may sit inside a fragment (Prettier keeps one where no space was written).
      'astro/jsx-a11y/label-has-associated-control': ['error', { depth: 3 }],
    },
  },
  {
    // Imports into src/ from another folder use the ~ alias (scripts/dev/to-alias-imports.mjs rewrites old ones).
    // In src/ only a climb out of src/ (scripts/lib, the root auth.config) stays relative.
    files: ['src/**/*.{ts,tsx,astro}'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ regex: '^(\\.\\./)+(?!\\.\\./|scripts/|auth\\.config)', message: 'Import from src/ as ~/… (the alias), not ../' }] },
      ],
    },
  },
  {
    files: ['tests/**', 'e2e/**', 'bench/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ regex: '^(\\.\\./)+src/', message: 'Import from src/ as ~/… (the alias)' }] }],
    },
  },
  {
    // Tests read JSON bodies of the server under test as they come; the assertions are the check.
    files: ['tests/**', 'e2e/**'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  {
    // Astro's own generated reference to its types; an import cannot replace it in a .d.ts.
    files: ['src/env.d.ts'],
    rules: { '@typescript-eslint/triple-slash-reference': 'off' },
  },
);
