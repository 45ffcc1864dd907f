// Flat ESLint config with type-aware rules for every workspace (docs/architecture.md).
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import importX from 'eslint-plugin-import-x';
import jsxA11y from 'eslint-plugin-jsx-a11y-x';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  {
    ignores: [
      '**/node_modules/**',
      '**/dist/**',
      '.data/**',
      'artifacts/**',
      'coverage/**',
      '**/*.js',
      '**/*.mjs',
      '**/*.cjs',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommendedTypeChecked,
  {
    languageOptions: {
      parserOptions: {
        projectService: true,
        tsconfigRootDir: import.meta.dirname,
      },
      globals: { ...globals.node },
    },
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-floating-promises': 'error',
    },
  },
  {
    files: ['frontend/src/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks, 'jsx-a11y-x': jsxA11y },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'error',
      ...jsxA11y.configs.recommended.rules,
      // MUI components (TextField in a dialog) focus their first field, as dialogs should
      'jsx-a11y-x/no-autofocus': ['error', { ignoreNonDOM: true }],
    },
  },
  {
    // The house's layers: no import cycles; the browser and the server never reach into each other
    // or into the fakes; features don't reach into each other's insides except through what they
    // export from api/, components/, hooks/ and utils/; shared code never imports a feature.
    files: ['**/*.{ts,tsx}'],
    plugins: { 'import-x': importX },
    settings: { 'import-x/resolver': { node: { extensions: ['.ts', '.tsx'] } } },
    rules: {
      'import-x/no-cycle': ['error', { ignoreExternal: true, maxDepth: 12 }],
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            {
              target: './frontend',
              from: './backend',
              message: 'the browser talks to the server over HTTP only',
            },
            { target: './backend', from: './frontend', message: 'the server never imports browser code' },
            { target: './backend', from: './fakes', message: 'the app never imports code from a fake' },
            { target: './frontend', from: './fakes', message: 'the app never imports code from a fake' },
            {
              target: './shared-types',
              from: ['./backend', './frontend', './fakes'],
              message: 'shared-types depends on nothing of the app',
            },
            {
              target: './frontend/src/components',
              from: './frontend/src/features',
              message: 'shared components never import a feature',
            },
            {
              target: './frontend/src/lib',
              from: './frontend/src/features',
              message: 'lib never imports a feature',
            },
            {
              target: './backend/src/baselines/spring-model',
              from: './backend/src',
              except: ['./baselines/spring-model'],
              message: 'the spring model is pure: no Nest, no I/O',
            },
            {
              target: './backend/src/appointments/availability',
              from: './backend/src',
              except: ['./appointments/availability'],
              message: 'availability is pure: no Nest, no I/O',
            },
          ],
        },
      ],
    },
  },
  {
    // Tests read loosely typed JSON bodies (supertest, fetch); the assertions check their shape.
    files: [
      '**/*.spec.ts',
      '**/*.e2e-spec.ts',
      '**/*.test.ts',
      '**/*.test.tsx',
      '**/e2e/**/*.ts',
      '**/test/**/*.ts',
    ],
    rules: {
      '@typescript-eslint/no-unsafe-member-access': 'off',
      '@typescript-eslint/no-unsafe-assignment': 'off',
      '@typescript-eslint/no-unsafe-argument': 'off',
      '@typescript-eslint/no-unsafe-call': 'off',
      '@typescript-eslint/unbound-method': 'off',
    },
  },
  prettier,
);
