// In development (`npm run dev`) Metro serves the app on :8081 and forwards /api/* to the
// Express server, so the client uses the same relative URLs as in production.
const http = require('node:http');
const { getDefaultConfig } = require('expo/metro-config');

const path = require('node:path');

const config = getDefaultConfig(__dirname);

// The web fonts ship as WOFF2 (constants/fonts.web.ts).
config.resolver.assetExts = [...config.resolver.assetExts, 'woff2'];

// zod's locale index pulls in every language; the app uses English only. Tied to zod 4's
// internal path (zod/v4/locales/index.js): recheck on a zod upgrade.
const zodLocalesEn = path.join(__dirname, 'scripts/zod-locales-en.js');
const upstreamResolve = config.resolver.resolveRequest;
config.resolver.resolveRequest = (context, moduleName, platform) => {
  if (moduleName === '../locales/index.js' && /[\\/]zod[\\/]v4[\\/](classic|core|mini)[\\/]/.test(context.originModulePath)) {
    return { type: 'sourceFile', filePath: zodLocalesEn };
  }
  return upstreamResolve ? upstreamResolve(context, moduleName, platform) : context.resolveRequest(context, moduleName, platform);
};
const apiPort = Number(process.env.PORT || 8080);

config.server = {
  ...config.server,
  enhanceMiddleware: (metroMiddleware) => (req, res, next) => {
    if (!req.url || !req.url.startsWith('/api/')) return metroMiddleware(req, res, next);
    const upstream = http.request(
      { host: '127.0.0.1', port: apiPort, path: req.url, method: req.method, headers: req.headers },
      (reply) => {
        res.writeHead(reply.statusCode || 502, reply.headers);
        reply.pipe(res);
      },
    );
    upstream.on('error', () => {
      res.writeHead(502, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ error: { code: 'api_unreachable', message: `The API on port ${apiPort} is not answering.` } }));
    });
    req.pipe(upstream);
  },
};

module.exports = config;
