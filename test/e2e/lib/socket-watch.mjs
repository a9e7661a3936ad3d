// When the workbench's WebSocket to the editor's server carried a what-if: the click's request
// going out (found by its `panelPosted` time, protocol.ts WhatIfHops) and its answer coming in
// (found by its `hostPosted` time). With these the panel → host and host → panel hops split into
// the browser's part (webview → workbench → socket) and the extension host's part (socket → the
// extension's handler), by Date.now(), the clock every side uses.

/** Starts watching the page's WebSockets (idempotent): wraps WebSocket.prototype.send. */
export async function watchSockets(page) {
  await page.evaluate(() => {
    if (globalThis.__lwSocketWatch) return;
    const log = { sent: new Map(), received: new Map() };
    globalThis.__lwSocketWatch = log;
    const decoder = new TextDecoder();
    // The time value that follows `key` in a message (the key is JSON-escaped once or twice there).
    const timeAfter = (text, key) => {
      const at = text.indexOf(key);
      if (at < 0) return null;
      const digits = /^[\\":\s]*(\d+)/.exec(text.slice(at + key.length, at + key.length + 40));
      return digits ? Number(digits[1]) : null;
    };
    const textOf = (data) => {
      if (data instanceof ArrayBuffer) return data.byteLength < 1e6 ? decoder.decode(new Uint8Array(data)) : '';
      if (ArrayBuffer.isView(data)) return data.byteLength < 1e6 ? decoder.decode(new Uint8Array(data.buffer, data.byteOffset, data.byteLength)) : '';
      return typeof data === 'string' ? data : '';
    };
    const send = WebSocket.prototype.send;
    WebSocket.prototype.send = function (data) {
      if (!this.__lwWatched) {
        this.__lwWatched = true;
        // Added after the editor's own listener, so it runs once the editor has taken the frame.
        // The editor takes incoming frames as Blobs and reads them one at a time; the time kept
        // is the frame's arrival, its text is read aside.
        this.addEventListener('message', (event) => {
          const now = Date.now();
          const found = (text) => {
            const posted = text.includes('hostPosted') ? timeAfter(text, 'hostPosted') : null;
            if (posted !== null && !log.received.has(posted)) log.received.set(posted, now);
          };
          const data = event.data;
          if (data instanceof Blob) {
            if (data.size < 1e6) void data.arrayBuffer().then((b) => found(textOf(b)));
          } else found(textOf(data));
        });
      }
      const now = Date.now();
      const text = textOf(data);
      if (text.includes('panelPosted')) {
        const posted = timeAfter(text, 'panelPosted');
        if (posted !== null && !log.sent.has(posted)) log.sent.set(posted, now);
      }
      return send.call(this, data);
    };
  });
}

/**
 * Adds `socketSent` and `socketReceived` to each click's hops where the watch saw them (a socket
 * opened before watchSockets is seen from its first send after it).
 */
export async function addSocketTimes(page, clicks) {
  const seen = await page.evaluate(() => {
    const log = globalThis.__lwSocketWatch;
    return log ? { sent: [...log.sent], received: [...log.received] } : { sent: [], received: [] };
  });
  const sent = new Map(seen.sent);
  const received = new Map(seen.received);
  for (const c of clicks) {
    if (c.hops === null) continue;
    if (sent.has(c.hops.panelPosted)) c.hops.socketSent = sent.get(c.hops.panelPosted);
    if (received.has(c.hops.hostPosted)) c.hops.socketReceived = received.get(c.hops.hostPosted);
  }
}
