/**
 * A scheduler of zero-delay macrotasks for a stepping loop that must leave room for incoming
 * messages between slices. Browsers: a message to ourselves on a MessageChannel (setTimeout is
 * clamped to 4 ms once nested). Node: setImmediate, because Node drains up to a thousand queued port
 * messages in one go, which would starve timers and other messages behind a self-posting port.
 */
export interface Macrotask {
  /** Run the callback once, soon, after pending messages; calls while one is queued are merged. */
  queue(): void;
  /** Drop a queued run and release the channel. */
  close(): void;
}

export function macrotask(run: () => void): Macrotask {
  let queued = false;
  let closed = false;
  const fire = (): void => {
    queued = false;
    if (!closed) run();
  };
  if (typeof setImmediate === 'function') {
    let handle: ReturnType<typeof setImmediate> | null = null;
    return {
      queue() {
        if (queued || closed) return;
        queued = true;
        handle = setImmediate(fire);
      },
      close() {
        closed = true;
        if (handle !== null) clearImmediate(handle);
      },
    };
  }
  const channel = new MessageChannel();
  channel.port1.onmessage = fire;
  return {
    queue() {
      if (queued || closed) return;
      queued = true;
      channel.port2.postMessage(null);
    },
    close() {
      closed = true;
      channel.port1.close();
    },
  };
}
