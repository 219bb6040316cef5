// https://docs.expo.dev/guides/using-eslint/
const { defineConfig } = require('eslint/config');
const expoConfig = require('eslint-config-expo/flat');

module.exports = defineConfig([
  expoConfig,
  {
    ignores: ['dist/*', 'dist-server/*', '.data/*', '.artifacts/*', '.expo/*', 'expo-env.d.ts'],
  },
  {
    files: ['server/**', 'db/**', 'scripts/**', 'tests/server/**', 'tests/e2e/**'],
    rules: { 'import/no-nodejs-modules': 'off' },
  },
  {
    // Plain CommonJS run by Node (jest's global set-up, script helpers).
    files: ['**/*.js'],
    languageOptions: {
      globals: { __dirname: 'readonly', require: 'readonly', module: 'writable', process: 'readonly', console: 'readonly' },
    },
  },
]);
