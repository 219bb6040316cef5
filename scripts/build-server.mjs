// The production server: server/index.ts and everything it imports bundled by esbuild into one
// CommonJS file run by plain node (no TypeScript transform at run time); packages stay in
// node_modules. Development and scripts keep tsx.
import { build } from 'esbuild';

await build({
  // The API and the job worker it starts (server/worker.ts).
  entryPoints: ['server/index.ts', 'server/worker.ts'],
  outdir: 'dist-server',
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'cjs',
  packages: 'external',
  sourcemap: true,
  logLevel: 'warning',
});
