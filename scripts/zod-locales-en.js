// Stands in for zod's locale index in the web bundle: the app speaks English only, and the full
// index brings every language's messages (about 270 KB). Wired by metro.config.js.
export { default as en } from 'zod/v4/locales/en.js';
