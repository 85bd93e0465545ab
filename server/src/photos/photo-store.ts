import { randomBytes } from 'node:crypto';
import { mkdir, readFile, rename, rm, stat, writeFile } from 'node:fs/promises';
import { join } from 'node:path';

/** The mode of the uploads folders and files: the server's user alone reads them. */
const FOLDER_MODE = 0o700;
const FILE_MODE = 0o600;

/**
 * The image files of the photos, under one folder (`UPLOADS_DIR`), each named by the SHA-256 of its content
 * in a sub-folder of the hash's first two characters: `ab/ab12…ef.jpg`. The same content twice is one file.
 * A file is written to a temporary name beside its place and then renamed, so that a reader never sees half
 * of one and a crash leaves no file under a hash it does not match.
 */
export class PhotoStore {
  constructor(readonly folder: string) {}

  /** Where the file of a hash and extension lives. */
  pathOf(sha256: string, extension: string): string {
    if (!/^[0-9a-f]{64}$/.test(sha256) || !/^[a-z]{3,4}$/.test(extension)) {
      throw new Error(`Not a stored image's name: ${sha256}.${extension}`);
    }
    return join(this.folder, sha256.slice(0, 2), `${sha256}.${extension}`);
  }

  /** Stores the bytes under their hash; answers false when the same content was there already. */
  async put(sha256: string, extension: string, bytes: Buffer): Promise<boolean> {
    const path = this.pathOf(sha256, extension);
    if (await this.has(sha256, extension)) return false;
    const folder = join(this.folder, sha256.slice(0, 2));
    await mkdir(folder, { recursive: true, mode: FOLDER_MODE });
    const temporary = join(folder, `.${sha256}.${randomBytes(6).toString('hex')}.tmp`);
    try {
      await writeFile(temporary, bytes, { mode: FILE_MODE, flag: 'wx' });
      await rename(temporary, path);
    } catch (error) {
      await rm(temporary, { force: true });
      throw error;
    }
    return true;
  }

  /** Whether a file of that hash is stored. */
  async has(sha256: string, extension: string): Promise<boolean> {
    try {
      return (await stat(this.pathOf(sha256, extension))).isFile();
    } catch {
      return false;
    }
  }

  /** The stored bytes, or undefined when the file is missing. */
  async read(sha256: string, extension: string): Promise<Buffer | undefined> {
    try {
      return await readFile(this.pathOf(sha256, extension));
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
      throw error;
    }
  }

  /** Deletes a stored file (nothing when it is not there). */
  async delete(sha256: string, extension: string): Promise<void> {
    await rm(this.pathOf(sha256, extension), { force: true });
  }
}
