// Brotli and gzip copies of every text and font file of the exported web app, made once at export
// time at the highest levels (too slow to do per request), served by server/web/web-app.ts.
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { brotliCompressSync, constants, gzipSync } from 'node:zlib';

const dir = process.argv[2] ?? 'dist';
const WORTH = /\.(js|css|html|json|svg|ttf|otf|map|txt|ico)$/;
let files = 0;
let before = 0;
let after = 0;
const walk = (d) => {
  for (const name of readdirSync(d)) {
    const p = path.join(d, name);
    if (statSync(p).isDirectory()) walk(p);
    else if (WORTH.test(name) && statSync(p).size > 512) {
      const raw = readFileSync(p);
      const br = brotliCompressSync(raw, { params: { [constants.BROTLI_PARAM_QUALITY]: 11, [constants.BROTLI_PARAM_SIZE_HINT]: raw.length } });
      writeFileSync(`${p}.br`, br);
      writeFileSync(`${p}.gz`, gzipSync(raw, { level: 9 }));
      files += 1;
      before += raw.length;
      after += br.length;
    }
  }
};
walk(dir);
console.log(`[precompress] ${files} files, ${before} B → ${after} B with Brotli`);
