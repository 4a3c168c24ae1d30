/**
 * Writes a file so a reader sees either the old bytes or the new ones, never a mix: the bytes go to a temp
 * file in the same folder (same file system, so rename(2) is atomic per POSIX), which is fsynced, then
 * renamed over the target; the folder is fsynced too so the rename survives a crash (common practice for
 * durable replace on Linux file systems). A failure removes the temp file and leaves the old file as it was.
 */
import { open, rename, rm } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import { join } from 'node:path';

/** Temp files are named `.<name>.<random>.tmp`, so a crash leaves a file that is easy to spot and ignore. */
export const tempName = (name: string) => `.${name}.${randomBytes(6).toString('hex')}.tmp`;

export async function writeFileAtomic(dir: string, name: string, bytes: Uint8Array): Promise<void> {
  const tmp = join(dir, tempName(name));
  try {
    const fh = await open(tmp, 'wx', 0o644);
    try {
      await fh.writeFile(bytes);
      await fh.sync();
    } finally {
      await fh.close();
    }
    await rename(tmp, join(dir, name));
  } catch (err) {
    await rm(tmp, { force: true });
    throw err;
  }
  await syncDir(dir);
}

async function syncDir(dir: string): Promise<void> {
  let fh;
  try {
    fh = await open(dir, 'r');
    await fh.sync();
  } catch {
    // some platforms cannot open or fsync a folder (Windows); the rename has happened either way
  } finally {
    await fh?.close();
  }
}
