import { z } from 'zod';

// The parts of the service worker's ngsw.json that tell which files the shell needs offline.
const ngswManifestSchema = z.object({
  assetGroups: z.array(
    z.object({
      name: z.string(),
      installMode: z.enum(['prefetch', 'lazy']),
      urls: z.array(z.string()),
    }),
  ),
});

/** Every URL the worker must hold before the app can start with no network. */
export function prefetchedUrls(manifest: unknown): string[] {
  const parsed = ngswManifestSchema.parse(manifest);
  return parsed.assetGroups.filter((group) => group.installMode === 'prefetch').flatMap((group) => group.urls);
}

/** The URLs of `urls` that `isCached` does not find, checked one after another. */
export async function missingUrls(
  urls: readonly string[],
  isCached: (url: string) => Promise<boolean>,
): Promise<string[]> {
  const missing: string[] = [];
  for (const url of urls) {
    if (!(await isCached(url))) missing.push(url);
  }
  return missing;
}
