// Runs inside Chromium before the app starts (context.addInitScript in bench/ui-bench.ts), as it is:
// plain JavaScript, because the bench's TypeScript is checked without the browser's types.
//
// It notes, on the page's own clock (performance.now()):
// - okClicks: each click on a glove keypad's OK key, in the capture phase, before the app sees it;
// - commits: each `complete` event of the app's write transaction (records + outbox + meta of the
//   Dexie database 'rimelog-device'), the moment IndexedDB has committed the reading, and in
//   commitStarts the moment that transaction was opened;
// - savedShown: each time the "Saved on this device" status gets new text.
// and offers floor(): plain IndexedDB puts of a given row, one per transaction, in a fresh database.
(() => {
  const marks = { okClicks: [], commits: [], commitStarts: [], savedShown: [] };
  window.rimelogBench = marks;

  window.addEventListener(
    'click',
    (event) => {
      if (event.target instanceof Element && event.target.closest('rl-glove-keypad .key.ok')) marks.okClicks.push(performance.now());
    },
    true,
  );

  const openTransaction = IDBDatabase.prototype.transaction;
  IDBDatabase.prototype.transaction = function (...args) {
    const transaction = openTransaction.apply(this, args);
    const stores = [...transaction.objectStoreNames].sort().join(',');
    if (this.name === 'rimelog-device' && transaction.mode === 'readwrite' && stores === 'meta,outbox,records') {
      const started = performance.now();
      transaction.addEventListener('complete', () => {
        marks.commits.push(performance.now());
        marks.commitStarts.push(started);
      });
    }
    return transaction;
  };

  let shownText = '';
  const watchSaved = () => {
    const text = document.querySelector('[data-section="saved"]')?.textContent?.trim() ?? '';
    if (text !== shownText) {
      shownText = text;
      if (text.startsWith('✓ Saved')) marks.savedShown.push(performance.now());
    }
  };
  document.addEventListener('DOMContentLoaded', () => {
    new MutationObserver(watchSaved).observe(document.body, { childList: true, subtree: true, characterData: true });
  });

  const request = (req) =>
    new Promise((resolve, reject) => {
      req.onsuccess = () => resolve(req.result);
      req.onerror = () => reject(req.error);
    });

  /** The newest reading the app stored and its outbox entry: what one OK writes. */
  marks.storedSample = async () => {
    const db = await request(indexedDB.open('rimelog-device'));
    try {
      const tx = db.transaction(['records', 'outbox'], 'readonly');
      const records = (await request(tx.objectStore('records').getAll())).filter((r) => r.kind === 'control-reading');
      const record = records.sort((a, b) => a.hlc.localeCompare(b.hlc)).at(-1);
      const outbox = await request(tx.objectStore('outbox').index('recordId').get(record.id));
      return { readings: records.length, record, outbox };
    } finally {
      db.close();
    }
  };

  /** `count` writes of `row` (a fresh id each), one transaction each with durability 'strict', like the app's. */
  marks.floor = async (count, row) => {
    const name = 'rimelog-bench-floor';
    await request(indexedDB.deleteDatabase(name));
    const opening = indexedDB.open(name, 1);
    opening.onupgradeneeded = () => opening.result.createObjectStore('rows', { keyPath: 'id' });
    const db = await request(opening);
    const times = [];
    try {
      for (let i = 0; i < count; i++) {
        const started = performance.now();
        await new Promise((resolve, reject) => {
          const tx = db.transaction('rows', 'readwrite', { durability: 'strict' });
          tx.objectStore('rows').put({ ...row, id: `floor-${i}` });
          tx.oncomplete = resolve;
          tx.onerror = () => reject(tx.error);
          tx.onabort = () => reject(tx.error ?? new Error('floor write aborted'));
        });
        times.push(performance.now() - started);
      }
    } finally {
      db.close();
      await request(indexedDB.deleteDatabase(name));
    }
    return times;
  };
})();
