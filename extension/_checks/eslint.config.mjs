// ESLint's recommended rules for the extension's scripts, run from
// extension/: _checks/node_modules/.bin/eslint -c _checks/eslint.config.mjs . Classic scripts
// share globals through globalThis; the browser's and the WebExtension
// APIs are the environment.
import js from '@eslint/js';
import globals from 'globals';

export default [
  { ignores: ['_checks/node_modules/', 'wasm_exec.js'] },
  js.configs.recommended,
  {
    files: ['**/*.js'],
    languageOptions: {
      ecmaVersion: 2023,
      sourceType: 'script',
      globals: { ...globals.browser, ...globals.webextensions, ...globals.serviceworker, Go: 'readonly' },
    },
  },
  {
    files: ['background.js', 'core.js', 'core-host.js', 'core-worker.js', 'keep.js', 'platform.js', 'findfunc.js', 'testdata/firefox/test-entry.js'],
    languageOptions: { sourceType: 'module' },
  },
  {
    files: ['test/**/*.js', '_checks/eslint.config.mjs'],
    languageOptions: { sourceType: 'module', globals: { ...globals.node } },
  },
];
