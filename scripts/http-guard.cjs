// Preloaded into `next start` (NODE_OPTIONS=--require): Next.js makes a fetch Request of every
// request before any of the app's code (proxy.ts included) runs, and fetch refuses the methods
// TRACE and TRACK, so Next would answer them 500. They are answered 405 here instead, like every
// other method the app does not take (proxy.ts).
const http = require('node:http');

const REFUSED = new Set(['TRACE', 'TRACK']);
const ALLOW = 'GET, HEAD, POST, PUT, PATCH, DELETE, OPTIONS';
const emit = http.Server.prototype.emit;

http.Server.prototype.emit = function guardedEmit(event, req, res) {
  if (event === 'request' && REFUSED.has(req.method)) {
    res.writeHead(405, {
      'content-type': 'application/json',
      allow: ALLOW,
      'cache-control': 'no-store',
      'x-content-type-options': 'nosniff',
      'content-security-policy': "default-src 'none'; frame-ancestors 'none'",
    });
    res.end(JSON.stringify({ error: { code: 'method_not_allowed', message: `${req.method} is not a method this app answers.` } }));
    return true;
  }
  return emit.apply(this, arguments);
};
