/**
 * Progress on standard error: on a terminal, one line that rewrites itself ("loudword: tokenizing…
 * 12 s") and is wiped when the review ends or fails, so the summary starts on a clean line; when
 * standard error is not a terminal (CI logs, a pipe), nothing.
 */
export interface ProgressLine {
  stage(name: string): void;
  /** Wipes the line; safe to call more than once. */
  clear(): void;
}

const CLEAR = '\r\x1b[2K';

export function progressLine(stream: Pick<NodeJS.WriteStream, 'write' | 'isTTY'>, enabled: boolean, now: () => number = Date.now): ProgressLine {
  if (!enabled || stream.isTTY !== true) return { stage() {}, clear() {} };
  const start = now();
  let shown = false;
  let current = '';
  const draw = (): void => {
    const seconds = Math.round((now() - start) / 1000);
    stream.write(`${CLEAR}loudword: ${current}…${seconds > 0 ? ` ${seconds} s` : ''}`);
    shown = true;
  };
  // Refreshes the seconds between stages; unref'd, so it never keeps the process alive.
  const timer = setInterval(() => current !== '' && draw(), 1000);
  timer.unref();
  return {
    stage(name) {
      current = name;
      draw();
    },
    clear() {
      clearInterval(timer);
      if (shown) stream.write(CLEAR);
      shown = false;
    },
  };
}
