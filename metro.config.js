// Metro for the web target. In development (`npm run dev`) requests to /api are forwarded to the
// Express server on PLUMBLINE_API_PORT, so the app and the API share one origin.
const http = require('node:http');
const { getDefaultConfig } = require('expo/metro-config');

const config = getDefaultConfig(__dirname);
const apiPort = process.env.PLUMBLINE_API_PORT;

if (apiPort) {
  config.server = {
    ...config.server,
    enhanceMiddleware: (metroMiddleware) => (req, res, next) => {
      if (!req.url || !req.url.startsWith('/api/')) return metroMiddleware(req, res, next);
      const upstream = http.request(
        { host: '127.0.0.1', port: Number(apiPort), path: req.url, method: req.method, headers: { ...req.headers, host: `127.0.0.1:${apiPort}` } },
        (up) => {
          res.writeHead(up.statusCode || 502, up.headers);
          up.pipe(res);
        },
      );
      upstream.on('error', () => {
        res.writeHead(502, { 'content-type': 'application/json' });
        res.end(JSON.stringify({ error: { code: 'api_unreachable', message: 'The API server is not running.' } }));
      });
      req.pipe(upstream);
    },
  };
}

module.exports = config;
