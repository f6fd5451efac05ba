// Lint rules, run by `npm test` (`npm run lint`). Besides typescript-eslint's recommended set,
// the layer boundaries of ARCHITECTURE.md are rules here:
//   src/core     pure TypeScript: no node:* or other Node built-in, no editor, no Node globals,
//                nothing from src/node, src/cli, src/extension or src/webview, no console output
//   src/node     no editor, nothing from src/cli, src/extension or src/webview
//   src/cli      no editor, nothing from src/extension or src/webview
//   src/webview  runs in the browser: only src/core (pure), no Node, no editor, no src/node
// Import cycles are checked by test/architecture.test.ts.
import js from '@eslint/js';
import { builtinModules } from 'node:module';
import tseslint from 'typescript-eslint';

const nodeBuiltins = builtinModules.filter((m) => !m.startsWith('_'));
const noNode = [
  { group: ['node:*'], message: 'src/core and src/webview are pure TypeScript: file system and other Node APIs belong in src/node.' },
];
const noNodeBare = nodeBuiltins.map((name) => ({ name, message: 'Node built-ins belong in src/node.' }));
const noEditor = { name: 'vscode', message: 'Only src/extension talks to the editor.' };
const layer = (folders, why) => ({ group: folders.flatMap((f) => [`**/${f}/*`, `**/${f}/**`]), message: why });

export default tseslint.config(
  {
    // src/core/matrix/wasm/assembly is AssemblyScript (compiled by asc, see its README), not TypeScript.
    ignores: [
      'dist/**',
      'out/**',
      'node_modules/**',
      'media/**',
      '.cache/**',
      'test-output/**',
      'cluster/**',
      '**/*.d.ts',
      'src/core/matrix/wasm/assembly/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: {
      ecmaVersion: 2022,
      sourceType: 'module',
      globals: {
        console: 'readonly',
        process: 'readonly',
        Buffer: 'readonly',
        URL: 'readonly',
        TextEncoder: 'readonly',
        TextDecoder: 'readonly',
        setTimeout: 'readonly',
        clearTimeout: 'readonly',
        setInterval: 'readonly',
        clearInterval: 'readonly',
        setImmediate: 'readonly',
        queueMicrotask: 'readonly',
        structuredClone: 'readonly',
        performance: 'readonly',
        WebAssembly: 'readonly',
        AbortController: 'readonly',
        AbortSignal: 'readonly',
        SharedArrayBuffer: 'readonly',
        Atomics: 'readonly',
        __dirname: 'readonly',
        require: 'readonly',
        globalThis: 'readonly',
        document: 'readonly',
        window: 'readonly',
        navigator: 'readonly',
        HTMLElement: 'readonly',
        requestAnimationFrame: 'readonly',
      },
    },
    rules: {
      // The code base's conventions that the recommended set would flag without finding faults:
      // unused names are already errors in tsc (noUnusedLocals / noUnusedParameters), `_name`
      // marks an intentionally unused one.
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      'no-undef': 'off', // tsc checks names
      // Wants `new Error(msg, { cause })`, which this project's lib setting (ES2022 plus the
      // web-worker lib file for WebAssembly types, see tsconfig.json) does not type.
      'preserve-caught-error': 'off',
    },
  },
  {
    // The editor loads this test extension as CommonJS.
    files: ['test/e2e/fixtures/**/*.js'],
    languageOptions: { sourceType: 'commonjs' },
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  {
    files: ['src/core/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [...noNodeBare, noEditor],
          patterns: [...noNode, layer(['node', 'cli', 'extension', 'webview'], 'src/core depends on nothing outside src/core.')],
        },
      ],
      'no-restricted-globals': [
        'error',
        ...['process', 'Buffer', '__dirname', '__filename', 'require'].map((name) => ({
          name,
          message: 'src/core runs anywhere: no Node globals.',
        })),
      ],
      'no-console': 'error',
    },
  },
  {
    files: ['src/node/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [noEditor],
          patterns: [layer(['cli', 'extension', 'webview'], 'src/node serves the command line and the editor; it imports neither.')],
        },
      ],
    },
  },
  {
    files: ['src/cli/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [noEditor],
          patterns: [layer(['extension', 'webview'], 'The command line runs without the editor.')],
        },
      ],
    },
  },
  {
    files: ['src/webview/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          paths: [...noNodeBare, noEditor],
          patterns: [...noNode, layer(['node', 'cli', 'extension'], 'The map page runs in the browser: it may use src/core only.')],
        },
      ],
    },
  },
);
