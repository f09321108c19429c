// Lint: type-aware rules and the one-way import boundaries (shared → api / web; never api ↔ web).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import importX from 'eslint-plugin-import-x';

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'drizzle/**', 'uploads-fake/data/**', '.data/**', 'tests/artifacts/**', 'bench/results/**', '**/*.mjs', '**/*.mts'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.ts', '**/*.tsx'],
    languageOptions: {
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
    },
    plugins: { 'import-x': importX },
    rules: {
      '@typescript-eslint/no-floating-promises': 'error',
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports', disallowTypeAnnotations: false }],
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-explicit-any': 'off',
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            { target: './shared', from: ['./src-api', './src-web', './tests'], message: 'shared/ is imported by both sides and imports neither' },
            { target: './src-web', from: './src-api', message: 'the web app talks to the API over HTTP only' },
            { target: './src-api', from: './src-web', message: 'the API does not import web code' },
          ],
        },
      ],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [{ group: ['node:*', 'fs', 'path', 'react', 'react-dom', '@nestjs/*', 'drizzle-orm*', 'pg'], message: 'shared/ stays pure: the browser bundles it' }] }],
    },
  },
  {
    files: ['src-web/**/*.tsx', 'src-web/**/*.ts'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'warn' },
  },
  {
    // Nest injects by constructor parameter type: those imports must stay value imports.
    files: ['src-api/**/*.ts'],
    rules: { '@typescript-eslint/consistent-type-imports': 'off' },
  },
);
