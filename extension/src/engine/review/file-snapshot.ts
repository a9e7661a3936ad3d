import { promises as fs } from 'node:fs';
import { UserError } from '../user-error';

/**
 * The corpus is streamed, not copied, so a file rewritten during the read would give a review of
 * half one version and half another. We note the file's identity (device, inode), size and
 * modification and change times before reading and refuse the result if any moved: a review is
 * of one consistent snapshot, or of none. The change time (ctime) cannot be set back by a
 * writer, so a same-size rewrite that restores the mtime is caught too.
 */
export class FileSnapshot {
  private constructor(
    private readonly file: string,
    private readonly stamp: string,
    /** The file's size in bytes when the snapshot was taken. */
    readonly size: number,
  ) {}

  /** Null when the file can't be stated; the reader then reports the real problem itself. */
  static async take(file: string): Promise<FileSnapshot | null> {
    try {
      const s = await fs.stat(file, { bigint: true });
      return new FileSnapshot(file, `${s.dev}:${s.ino}:${s.size}:${s.mtimeNs}:${s.ctimeNs}`, Number(s.size));
    } catch {
      return null;
    }
  }

  async assertUnchanged(): Promise<void> {
    const now = await FileSnapshot.take(this.file);
    if (now === null || now.stamp !== this.stamp) {
      const how = now === null ? 'it is gone now' : now.size > this.size ? `it grew from ${this.size} to ${now.size} bytes` : now.size < this.size ? `it shrank from ${this.size} to ${now.size} bytes` : 'it was rewritten';
      throw new UserError(`the file changed while it was being read (${how}); review it again once it is saved`, this.file);
    }
  }
}
