import { randomUUID } from 'node:crypto';
import { mkdir, open, rename, rm, stat } from 'node:fs/promises';
import path from 'node:path';

const sha256Hex = /^[0-9a-f]{64}$/;

/**
 * Where a file lives: `<uploadsDir>/<first 2 hex>/<sha256>`, so no folder grows too large. Checked
 * here as well as in the routes: whatever a caller passes, a file name never leaves the folder.
 */
export function uploadPath(uploadsDir: string, sha256: string): string {
  if (!sha256Hex.test(sha256)) throw new Error(`Not a SHA-256 in lower-case hex: ${JSON.stringify(sha256.slice(0, 80))}.`);
  return path.resolve(uploadsDir, sha256.slice(0, 2), sha256);
}

export async function hasStoredFile(uploadsDir: string, sha256: string): Promise<boolean> {
  try {
    return (await stat(uploadPath(uploadsDir, sha256))).isFile();
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === 'ENOENT') return false;
    throw error;
  }
}

async function syncFolder(folder: string): Promise<void> {
  const handle = await open(folder, 'r');
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}

/**
 * Writes the file under a temporary name, flushes it to disk, then renames it into place, so a file
 * under its final name is always complete: a crash or a second upload of the same file at the same
 * moment never leaves half a file where a download would find it. The rename is atomic because
 * `incoming/` is on the same file system as the final folder.
 */
export async function storeFile(uploadsDir: string, sha256: string, bytes: Buffer): Promise<void> {
  const target = uploadPath(uploadsDir, sha256);
  const incoming = path.resolve(uploadsDir, 'incoming');
  await mkdir(incoming, { recursive: true });
  await mkdir(path.dirname(target), { recursive: true });
  const temporary = path.join(incoming, `${sha256}.${randomUUID()}`);
  try {
    const handle = await open(temporary, 'wx');
    try {
      await handle.writeFile(bytes);
      await handle.sync();
    } finally {
      await handle.close();
    }
    await rename(temporary, target);
  } catch (error) {
    await rm(temporary, { force: true });
    throw error;
  }
  // The rename itself must survive a power cut before the device is told the file is safe.
  await syncFolder(path.dirname(target));
}
