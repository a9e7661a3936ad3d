/**
 * The memory the engine's hand-written WebAssembly modules and their helping threads share: arrays
 * laid out one after another, each on a 64-byte line (so two threads' arrays never share a cache
 * line), in a shared WebAssembly memory where one can be had, else in a plain SharedArrayBuffer
 * (the callers then run the TypeScript the modules mirror: the same bits).
 */

/** Hands out byte offsets for arrays, each starting on a 64-byte line; `bytes` is the total so far. */
export function lineAllocator(): { take(bytes: number): number; readonly bytes: number } {
  let at = 0;
  return {
    take(bytes: number): number {
      const start = at;
      at += Math.ceil(bytes / 64) * 64;
      return start;
    },
    get bytes(): number {
      return at;
    },
  };
}

/** A shared WebAssembly memory of at least `bytes` bytes (throws beyond a memory's 4 GiB). */
export function sharedWasmMemory(bytes: number): WebAssembly.Memory {
  const pages = Math.max(1, Math.ceil(bytes / 65536));
  return new WebAssembly.Memory({ initial: pages, maximum: pages, shared: true });
}

/**
 * `bytes` of shared memory: a shared WebAssembly memory when `wanted` (the module is at hand) and
 * one can be made, else a plain SharedArrayBuffer (`memory` null).
 */
export function sharedMemoryFor(bytes: number, wanted: boolean): { memory: WebAssembly.Memory | null; buffer: SharedArrayBuffer } {
  let memory: WebAssembly.Memory | null = null;
  try {
    if (wanted) memory = sharedWasmMemory(bytes);
  } catch {
    // A WebAssembly memory holds at most 4 GiB: beyond, the caller's arrays live in a plain buffer.
    memory = null;
  }
  return { memory, buffer: memory !== null ? (memory.buffer as SharedArrayBuffer) : new SharedArrayBuffer(bytes) };
}
