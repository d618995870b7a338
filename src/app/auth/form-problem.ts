import type { z } from 'zod';

/** The first problem the shared schema finds with what was typed, in its words, or null when none. */
export function firstProblem(schema: z.ZodType, value: unknown): string | null {
  const result = schema.safeParse(value);
  return result.success ? null : (result.error.issues[0]?.message ?? 'Check what you typed.');
}

/** Only paths inside this app, so a crafted link cannot send an official elsewhere after sign-in. */
export function safeReturnUrl(url: string | undefined): string {
  if (!url || !url.startsWith('/') || url.startsWith('//') || url.startsWith('/\\') || url.startsWith('/sign-in')) return '/';
  return url;
}
