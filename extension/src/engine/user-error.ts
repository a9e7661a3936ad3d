/**
 * An error caused by the user's input (a file, a setting), not by a bug. The CLI prints it
 * without a stack trace and exits non-zero; the extension shows it as a message. `file` and
 * `line` (1-based) say where to look.
 */
export class UserError extends Error {
  constructor(
    message: string,
    readonly file: string | null = null,
    readonly line: number | null = null,
    /** The setting the input disagrees with ("label"), so the message can say where it was set. */
    readonly setting: string | null = null,
  ) {
    super(message);
    this.name = 'UserError';
  }

  /** "file:line: message", the form editors and terminals turn into links. */
  describe(): string {
    if (this.file === null) return this.message;
    return this.line === null ? `${this.file}: ${this.message}` : `${this.file}:${this.line}: ${this.message}`;
  }
}

export function isUserError(e: unknown): e is UserError {
  return e instanceof UserError;
}
