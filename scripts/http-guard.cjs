// Preloaded into `next start` (NODE_OPTIONS=--require): answers 405, with the app's JSON error and
// headers, the methods that never reach the app's code (proxy.ts answers every other unknown one):
// - TRACE: Next.js makes a fetch Request of every request first, and fetch refuses it (500);
// - CONNECT: Node hands it to a 'connect' listener (none) and would drop the connection;
// - names Node's HTTP parser does not know (TRACK, BREW, FOO): Node would answer a bare 400;
// - anything but GET and HEAD on the build's static files, which the proxy does not see and which
//   Next.js answers with a 500;
// - on the JSON API (which the proxy does not see either), any method outside the app's list.
const http = require('node:http');

const REFUSED = new Set(['TRACE']);
// The same list as proxy.ts.
const ALLOW = 'GET, HEAD, POST, PUT, PATCH, DELETE, OPTIONS';
const STATIC = /^\/_next\/(static\/|image(\?|$))/;
const API = /^\/api(\/|\?|$)/;
const ALLOWED = new Set(ALLOW.split(', '));
const HEADERS = {
  'content-type': 'application/json',
  allow: ALLOW,
  'cache-control': 'no-store',
  'x-content-type-options': 'nosniff',
  'x-frame-options': 'DENY',
  'referrer-policy': 'same-origin',
  // As for the build's files (next.config.ts): a JSON answer runs nothing.
  'content-security-policy': "default-src 'none'; object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'",
};

function refusal(method) {
  const what = method ? `${method} is not a method` : 'That is not a method';
  return JSON.stringify({ error: { code: 'method_not_allowed', message: `${what} this app answers.` } });
}

/** A whole 405 written straight to the socket, for when Node has no response object to give. */
function refuseOnSocket(socket, method) {
  if (!socket.writable) return socket.destroy();
  const body = refusal(method);
  const head = Object.entries({ ...HEADERS, 'content-length': Buffer.byteLength(body), connection: 'close' })
    .map(([k, v]) => `${k}: ${v}\r\n`)
    .join('');
  socket.end(`HTTP/1.1 405 Method Not Allowed\r\n${head}\r\n${body}`);
}

const emit = http.Server.prototype.emit;

http.Server.prototype.emit = function guardedEmit(event, ...args) {
  if (event === 'request') {
    const [req, res] = args;
    if (REFUSED.has(req.method) || (API.test(req.url ?? '') && !ALLOWED.has(req.method))) {
      res.writeHead(405, HEADERS);
      res.end(refusal(req.method));
      return true;
    }
    if (req.method !== 'GET' && req.method !== 'HEAD' && STATIC.test(req.url ?? '')) {
      res.writeHead(405, { ...HEADERS, allow: 'GET, HEAD' });
      res.end(JSON.stringify({ error: { code: 'method_not_allowed', message: 'The build files are only read: use GET or HEAD.' } }));
      return true;
    }
  }
  // Node emits 'connect' only to a server that listens for it, so the guard listens.
  if (event === 'listening' && this.listenerCount('connect') === 0) {
    this.on('connect', (req, socket) => refuseOnSocket(socket, 'CONNECT'));
  }
  // The name is not echoed: it is whatever bytes the parser could not read as a method.
  if (event === 'clientError' && args[0]?.code === 'HPE_INVALID_METHOD') {
    refuseOnSocket(args[1]);
    return true;
  }
  return emit.call(this, event, ...args);
};
