// Preloaded with `node --require` in the no-network test: any attempt to open a socket, resolve
// a host name or call fetch from the process (or its worker threads) fails loudly.
'use strict';
const net = require('node:net');
const dns = require('node:dns');
const fail = (what) => () => {
  process.stderr.write(`NETWORK ATTEMPT: ${what}\n`);
  process.exit(97);
};
net.Socket.prototype.connect = fail('net.Socket.connect');
dns.lookup = fail('dns.lookup');
dns.resolve = fail('dns.resolve');
globalThis.fetch = fail('fetch');
