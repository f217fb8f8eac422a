// Preloaded into the app server (`node --require scripts/peer-address.cjs …/next start`, see
// scripts/lib/services.mjs). Next.js does not pass the socket to route handlers, so this copies the TCP
// peer of every request into the `x-tauforge-peer` header, overwriting whatever a client sent under that
// name, and marks the process so lib/server/client-address.ts believes the header. The client address
// is then derived from this peer and, only through proxies listed in TAUFORGE_TRUSTED_PROXIES, from
// X-Forwarded-For.
'use strict';
// eslint-disable-next-line @typescript-eslint/no-require-imports -- a --require preload is CommonJS
const http = require('node:http');

const HEADER = 'x-tauforge-peer';
globalThis.__tauforgePeerHeader = true;

const emit = http.Server.prototype.emit;
http.Server.prototype.emit = function patchedEmit(event, req, ...rest) {
  if (event === 'request' && req && req.headers) {
    const peer = (req.socket && req.socket.remoteAddress) || '';
    req.headers[HEADER] = peer;
    // Drop a client-sent copy from rawHeaders too, so no layer can read the forged one.
    if (Array.isArray(req.rawHeaders)) {
      for (let i = req.rawHeaders.length - 2; i >= 0; i -= 2) {
        if (String(req.rawHeaders[i]).toLowerCase() === HEADER) req.rawHeaders.splice(i, 2);
      }
      req.rawHeaders.push(HEADER, peer);
    }
  }
  return emit.call(this, event, req, ...rest);
};
