import { emptyEntry } from './keypad-entry';
import { clearKeypadDraft, keypadDraftMaxAgeMs, keypadDraftStorageKey, readKeypadDraft, writeKeypadDraft, type KeypadDraftState } from './keypad-drafts';

const savedAt = Date.parse('2027-01-09T09:00:00.000Z');
const halfKeyed: KeypadDraftState = { entry: { isNegative: true, whole: '4', hasPoint: true, tenth: '' }, isTyping: false, typedText: '' };

describe('keypad drafts', () => {
  beforeEach(() => localStorage.clear());

  it('when a draft is written, then it reads back the same under its own key only, with when it was saved', () => {
    writeKeypadDraft('check:1:steel:left:0', halfKeyed, savedAt);
    expect(localStorage.getItem('rimelog.keypad-draft.check:1:steel:left:0')).not.toBeNull();
    expect(readKeypadDraft('check:1:steel:left:0', savedAt + 1000)).toEqual({ ...halfKeyed, savedAt });
    expect(readKeypadDraft('check:1:steel:left:1', savedAt)).toBeNull();
  });

  it('when a draft is cleared, then nothing reads back', () => {
    writeKeypadDraft('a', halfKeyed, savedAt);
    clearKeypadDraft('a');
    expect(readKeypadDraft('a', savedAt)).toBeNull();
  });

  it('when a draft is 12 hours old, then it still reads; a moment later it is dropped from the device', () => {
    writeKeypadDraft('a', halfKeyed, savedAt);
    expect(readKeypadDraft('a', savedAt + keypadDraftMaxAgeMs)?.entry).toEqual(halfKeyed.entry);
    expect(readKeypadDraft('a', savedAt + keypadDraftMaxAgeMs + 1)).toBeNull();
    expect(localStorage.getItem(keypadDraftStorageKey('a'))).toBeNull();
  });

  it('when the kept text is not a draft (another shape, a tenth without a point, too many digits, not JSON), then nothing reads back', () => {
    const kept = (value: string) => localStorage.setItem(keypadDraftStorageKey('a'), value);
    const draft = (entry: object) => JSON.stringify({ entry, isTyping: false, typedText: '', savedAt });
    for (const text of [
      JSON.stringify({ tenths: -40 }),
      draft({ ...emptyEntry, whole: '4', tenth: '5' }),
      draft({ ...emptyEntry, whole: '123456' }),
      draft({ ...emptyEntry, whole: '4a' }),
      '{not json',
    ]) {
      kept(text);
      expect(readKeypadDraft('a', savedAt)).toBeNull();
    }
  });

  it('when the typed text is very long, then the draft keeps its start and still reads back', () => {
    writeKeypadDraft('a', { ...halfKeyed, isTyping: true, typedText: '1'.repeat(500) }, savedAt);
    expect(readKeypadDraft('a', savedAt)?.typedText).toHaveLength(100);
  });
});
