// Every wait in the e2e run goes through here, so a timeout always says what was awaited
// instead of a bare "Timeout 30000ms exceeded".

/**
 * Polls `probe` until it returns a truthy value and returns that value.
 * @param {string} what  what is awaited, as a person would say it ("the Distance Review panel")
 * @param {() => Promise<unknown> | unknown} probe  a thrown error counts as "not yet"
 * @param {{ timeout?: number, interval?: number }} [options]
 */
export async function waitUntil(what, probe, { timeout = 20000, interval = 250 } = {}) {
  const deadline = Date.now() + timeout;
  let lastError;
  for (;;) {
    try {
      const value = await probe();
      if (value) return value;
    } catch (error) {
      lastError = error;
    }
    if (Date.now() >= deadline) {
      const detail = lastError ? ` (last error: ${firstLine(lastError)})` : '';
      throw new Error(`timed out after ${Math.round(timeout / 1000)} s waiting for ${what}${detail}`);
    }
    await new Promise((resolve) => setTimeout(resolve, interval));
  }
}

/** Runs a playwright call that has its own timeout, renaming its error after what was awaited. */
export async function named(what, promise) {
  try {
    return await promise;
  } catch (error) {
    throw new Error(`${what}: ${firstLine(error)}`);
  }
}

function firstLine(error) {
  return String(error instanceof Error ? error.message : error).split('\n')[0];
}
