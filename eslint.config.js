// Lint for every TypeScript and JavaScript file; .svelte files are checked by svelte-check.
// Besides the recommended rules, it keeps the layering of docs/DEVELOPERS (the house):
//   lib/ imports nothing from src/, workers/ or cli/;
//   lib/io (formats) imports neither analysis, plan, userfile, run nor sweep at run time;
//   lib/analysis does not import the stepper or the Model (it reads states, it does not advance them);
//   lib/plan does not import the model's arrays (only parameters, their validation and limits);
//   lib/model imports nothing else of lib but the shared error type;
//   no import cycles anywhere.
// Type-only imports may cross a boundary: they vanish at run time (a writer may name the shape of
// what it writes).
import js from '@eslint/js';
import { createNodeResolver, importX } from 'eslint-plugin-import-x';
import globals from 'globals';
import tseslint from 'typescript-eslint';

/** A no-restricted-imports rule that forbids `patterns` at run time (type imports allowed). */
function forbid(patterns) {
  return {
    '@typescript-eslint/no-restricted-imports': [
      'error',
      { patterns: patterns.map((p) => ({ ...p, allowTypeImports: true })) },
    ],
  };
}

const outsideLib = [
  {
    group: ['**/src/**', '**/workers/**', '**/cli/**', '../../src/*', '../../workers/*', '../../cli/*'],
    message: 'lib/ is pure: it imports nothing from src/, workers/ or cli/.',
  },
];

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'scratch/**', 'coverage/**', 'bench/out/**', 'e2e/artifacts/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createNodeResolver({ extensions: ['.ts', '.js', '.mjs', '.svelte', '.json'] })],
      // The cycle rule parses the files it follows: TypeScript needs its own parser there.
      'import-x/parsers': { '@typescript-eslint/parser': ['.ts'] },
      'import-x/extensions': ['.ts', '.js', '.mjs'],
    },
    rules: {
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' },
      ],
    },
  },
  { files: ['lib/**/*.ts'], rules: forbid(outsideLib) },
  // Ambient declarations of platform globals are written the way the platforms' own types write them.
  { files: ['**/*.d.ts'], rules: { 'no-var': 'off' } },
  // Published digits are quoted as printed, beyond what a double holds: the test compares in ulps.
  { files: ['test/model/portableMath.test.ts'], rules: { 'no-loss-of-precision': 'off' } },
  {
    files: ['lib/io/**/*.ts'],
    rules: forbid([
      ...outsideLib,
      {
        group: ['../analysis/*', '../plan/*', '../userfile/*', '../run/*', '../sweep/*'],
        message: 'lib/io holds formats only: it imports neither analysis, plan, userfile, run nor sweep.',
      },
    ]),
  },
  {
    files: ['lib/analysis/**/*.ts'],
    rules: forbid([
      ...outsideLib,
      {
        group: ['../model/stepper', '../model/model'],
        message: 'lib/analysis reads model states; it does not import the stepper or the Model.',
      },
      {
        group: ['../plan/*', '../userfile/*', '../run/*', '../sweep/*'],
        message: 'lib/analysis sits below plan, userfile, run and sweep.',
      },
    ]),
  },
  {
    files: ['lib/plan/**/*.ts'],
    rules: forbid([
      ...outsideLib,
      {
        regex: '^\\.\\./model/(?!params$|validateParams$|grid$)',
        message:
          "lib/plan does not import the model's arrays: only its parameters, their validation and the grid's limits.",
      },
      { group: ['../userfile/*', '../run/*', '../sweep/*'], message: 'lib/plan sits below userfile, run and sweep.' },
    ]),
  },
  {
    files: ['lib/model/**/*.ts'],
    rules: forbid([
      ...outsideLib,
      { regex: '^\\.\\./(?!inputError$)', message: 'lib/model is the bottom layer: it imports nothing else of lib.' },
    ]),
  },
);
