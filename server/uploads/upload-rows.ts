import { eq } from 'drizzle-orm';
import type { Database } from '../db/client';
import { uploads } from '../db/schema';
import type { UploadContentType } from './file-kinds';

/** What the server answers about a stored file; the same every time the same file is sent. */
export interface UploadReceipt {
  sha256: string;
  contentType: UploadContentType;
  sizeBytes: number;
  uploadedAt: string;
}

function toReceipt(row: typeof uploads.$inferSelect): UploadReceipt {
  return {
    sha256: row.sha256,
    contentType: row.contentType as UploadContentType,
    sizeBytes: row.sizeBytes,
    uploadedAt: row.uploadedAt.toISOString(),
  };
}

export async function findUpload(db: Database, sha256: string): Promise<UploadReceipt | undefined> {
  const [row] = await db.select().from(uploads).where(eq(uploads.sha256, sha256));
  return row ? toReceipt(row) : undefined;
}

/** Adds the row unless the file is already known; `created` says which, the receipt is the stored one. */
export async function recordUpload(
  db: Database,
  upload: { sha256: string; contentType: UploadContentType; sizeBytes: number; uploadedBy: string },
): Promise<{ created: boolean; receipt: UploadReceipt }> {
  const [inserted] = await db.insert(uploads).values(upload).onConflictDoNothing().returning();
  if (inserted) return { created: true, receipt: toReceipt(inserted) };
  const existing = await findUpload(db, upload.sha256);
  if (!existing) throw new Error(`Upload ${upload.sha256} neither inserted nor found.`);
  return { created: false, receipt: existing };
}
