import { existsSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import express from 'express';
import expressStaticGzip from 'express-static-gzip';
import { callBySlug } from '../calls/calls.service';

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** The best of the encodings made at export time (scripts/precompress.mjs) that the client takes. */
function pickEncoding(req: express.Request): 'br' | 'gzip' | null {
  const accepted = String(req.headers['accept-encoding'] ?? '');
  if (/\bbr\b/.test(accepted)) return 'br';
  if (/\bgzip\b/.test(accepted)) return 'gzip';
  return null;
}

/**
 * The exported web app: hashed bundles with long caching, every file served from the Brotli or
 * gzip copy made at export time when the browser takes it, and an SPA fallback. A public call's
 * address gets its own title and sharing preview tags written into the page, since link previews
 * read the HTML and run no script.
 */
export function webApp(distDir: string, publicUrl: string): express.Router {
  const web = express.Router();
  const indexHtml = path.join(distDir, 'index.html');
  const compressed = { enableBrotli: true, orderPreference: ['br', 'gzip'], index: false as const };
  web.use('/_expo', expressStaticGzip(path.join(distDir, '_expo'), { ...compressed, serveStatic: { immutable: true, maxAge: '365d', index: false } }));
  web.use('/assets', expressStaticGzip(path.join(distDir, 'assets'), { ...compressed, serveStatic: { immutable: true, maxAge: '365d', index: false } }));
  web.use(expressStaticGzip(distDir, { ...compressed, serveStatic: { index: false } }));
  let shell: { html: string; at: number } | null = null;
  const readShell = () => {
    // Read once per export (the file changes only when the app is exported again).
    const at = statSync(indexHtml).mtimeMs;
    if (!shell || shell.at !== at) shell = { html: readFileSync(indexHtml, 'utf8'), at };
    return shell.html;
  };
  web.get('/call/:slug', async (req, res, next) => {
    if (!existsSync(indexHtml)) return next();
    let call: Awaited<ReturnType<typeof callBySlug>> | null = null;
    try {
      call = await callBySlug(String(req.params.slug));
    } catch {
      return next();
    }
    const title = `${call.title} — a fit trial by ${call.studio.name} | Basted`;
    const description = `${call.studio.name} is looking for testers to sew ${call.pattern.name}${call.accepting ? '. Applications are open.' : '.'}`;
    const url = `${publicUrl}/call/${encodeURIComponent(call.slug)}`;
    const tags = [
      `<title>${escapeHtml(title)}</title>`,
      `<meta name="description" content="${escapeHtml(description)}"/>`,
      `<meta property="og:type" content="website"/>`,
      `<meta property="og:title" content="${escapeHtml(title)}"/>`,
      `<meta property="og:description" content="${escapeHtml(description)}"/>`,
      `<meta property="og:url" content="${escapeHtml(url)}"/>`,
      `<meta property="og:site_name" content="Basted"/>`,
      `<meta name="twitter:card" content="summary"/>`,
    ].join('');
    const html = readShell()
      .replace(/<title>[^<]*<\/title>/, '')
      .replace(/<meta name="description"[^>]*>/, '')
      .replace('</head>', `${tags}</head>`);
    res.setHeader('Cache-Control', 'no-cache');
    res.type('html').send(html);
  });
  web.get('/{*splat}', (req, res) => {
    if (!existsSync(indexHtml)) {
      res.status(503).type('text').send('The web app is not built yet: run `npm start` (it exports it).');
      return;
    }
    res.setHeader('Cache-Control', 'no-cache');
    res.setHeader('Vary', 'Accept-Encoding');
    const encoding = pickEncoding(req);
    const file = encoding === 'br' ? `${indexHtml}.br` : encoding === 'gzip' ? `${indexHtml}.gz` : null;
    if (file && existsSync(file)) {
      res.setHeader('Content-Encoding', encoding!);
      res.type('html');
      res.sendFile(file);
      return;
    }
    res.sendFile(indexHtml);
  });
  return web;
}
