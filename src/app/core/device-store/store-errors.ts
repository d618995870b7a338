import type { FieldProblem } from '../../../../shared/api/api-error';

/** The device refused to save: the values are not a valid record, or the change is not allowed. */
export class RecordRefusedError extends Error {
  override readonly name = 'RecordRefusedError';
  constructor(
    message: string,
    readonly problems: readonly FieldProblem[] = [],
  ) {
    super(message);
  }
}

/** The browser refused the write because the device's storage is full; nothing of it was saved. */
export class StorageFullError extends Error {
  override readonly name = 'StorageFullError';
  constructor(readonly original: unknown) {
    super(
      'This device is out of storage, so the record was NOT saved. Sync now, or export a backup from the sync screen and free some space, then enter it again.',
    );
  }
}

/**
 * Dexie often reports a full disk as an AbortError whose `inner` is the QuotaExceededError
 * (dexie.org/docs/DexieErrors/Dexie.QuotaExceededError), so look down the chain of inner errors.
 */
export function isQuotaError(error: unknown): boolean {
  let current: unknown = error;
  for (let depth = 0; depth < 5 && typeof current === 'object' && current !== null; depth++) {
    if ((current as { name?: unknown }).name === 'QuotaExceededError') return true;
    current = (current as { inner?: unknown }).inner;
  }
  return false;
}

/** Rethrows a failed write, as StorageFullError when the disk is full: a failed write is never swallowed. */
export function storageFailure(error: unknown): Error {
  if (isQuotaError(error)) return new StorageFullError(error);
  return error instanceof Error ? error : new Error(String(error));
}
