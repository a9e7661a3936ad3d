import { promises as fs } from 'node:fs';
import { UserError } from '../user-error';

/**
 * The corpus is streamed, not copied, so a file rewritten during the read would give a review of
 * half one version and half another. We note size and modification time before reading and
 * refuse the result if either moved: a review is of one consistent snapshot, or of none.
 */
export class FileSnapshot {
  private constructor(
    private readonly file: string,
    private readonly size: number,
    private readonly mtimeMs: number,
  ) {}

  /** Null when the file can't be stated; the reader then reports the real problem itself. */
  static async take(file: string): Promise<FileSnapshot | null> {
    try {
      const s = await fs.stat(file);
      return new FileSnapshot(file, s.size, s.mtimeMs);
    } catch {
      return null;
    }
  }

  async assertUnchanged(): Promise<void> {
    const now = await FileSnapshot.take(this.file);
    if (now === null || now.size !== this.size || now.mtimeMs !== this.mtimeMs) {
      throw new UserError('the file changed while it was being read; review it again once it is saved', this.file);
    }
  }
}
