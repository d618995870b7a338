import type { z } from 'zod';

// localStorage can be blocked (private mode) or hold an older shape: every read parses with a schema
// and every failure means "nothing kept", never a crash.

/** The value kept under `key`, or null when there is none or it no longer fits `schema`. */
export function readKept<T extends z.ZodType>(key: string, schema: T): z.infer<T> | null {
  try {
    const raw = localStorage.getItem(key);
    if (raw === null) return null;
    const parsed = schema.safeParse(JSON.parse(raw));
    return parsed.success ? parsed.data : null;
  } catch {
    // Blocked storage or text that is not JSON: treat it as nothing kept.
    return null;
  }
}

export function keep(key: string, value: unknown): void {
  try {
    localStorage.setItem(key, JSON.stringify(value));
  } catch {
    // Blocked or full storage: the value still holds in memory for this visit.
  }
}

export function forget(key: string): void {
  try {
    localStorage.removeItem(key);
  } catch {
    // Blocked storage holds nothing to forget.
  }
}
