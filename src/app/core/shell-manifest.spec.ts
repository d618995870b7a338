import { missingUrls, prefetchedUrls } from './shell-manifest';

const manifest = {
  configVersion: 1,
  assetGroups: [
    { name: 'app-shell', installMode: 'prefetch', updateMode: 'prefetch', urls: ['/index.html', '/main-AAAA.js'] },
    { name: 'fonts-and-icons', installMode: 'prefetch', updateMode: 'prefetch', urls: ['/media/font-BBBB.woff2'] },
    { name: 'later', installMode: 'lazy', updateMode: 'lazy', urls: ['/big-photo.jpg'] },
  ],
};

describe('prefetchedUrls', () => {
  it('when groups are prefetched or lazy, then only the prefetched files count for offline start', () => {
    expect(prefetchedUrls(manifest)).toEqual(['/index.html', '/main-AAAA.js', '/media/font-BBBB.woff2']);
  });

  it('when the manifest is not an ngsw manifest, then it throws instead of claiming readiness', () => {
    expect(() => prefetchedUrls({ hello: 'world' })).toThrow();
  });
});

describe('missingUrls', () => {
  it('when one file is not in the cache, then exactly that file is reported', async () => {
    const cached = new Set(['/index.html', '/main-AAAA.js']);
    const missing = await missingUrls(prefetchedUrls(manifest), async (url) => cached.has(url));
    expect(missing).toEqual(['/media/font-BBBB.woff2']);
  });
});
