import { z } from 'zod';
import { forget, keep, readKept } from '../../auth/local-json';
import { maxWholeDigits, type KeypadEntry } from './keypad-entry';

// A value half keyed on the glove keypad, kept on the device at every key so it survives the phone
// killing the app (a dead battery in the cold, the system closing it). Drafts are best effort: the
// value is only recorded when the host saves it after OK.

/** Older than this, a draft is from another session of work and must not resurface (next race day). */
export const keypadDraftMaxAgeMs = 12 * 60 * 60_000;

/** The longest "Type instead" text a draft keeps; nobody types a reading that long. */
const maxTypedLength = 100;

/** What the keypad showed when the draft was written. */
export interface KeypadDraftState {
  readonly entry: KeypadEntry;
  /** Whether the "Type instead" field was open. */
  readonly isTyping: boolean;
  /** What that field held: it can hold more than the entry shows ("3.45", refused). */
  readonly typedText: string;
}

export interface KeypadDraft extends KeypadDraftState {
  /** When it was written, in milliseconds since the epoch. */
  readonly savedAt: number;
}

const keypadEntrySchema = z
  .object({
    isNegative: z.boolean(),
    whole: z.string().regex(new RegExp(`^\\d{0,${maxWholeDigits}}$`)),
    hasPoint: z.boolean(),
    tenth: z.string().regex(/^\d?$/),
  })
  .refine((entry) => entry.hasPoint || entry.tenth === '', 'A tenth is keyed after the point only.');

const keypadDraftSchema = z.object({
  entry: keypadEntrySchema,
  isTyping: z.boolean(),
  typedText: z.string().max(maxTypedLength),
  savedAt: z.number().int().nonnegative(),
});

/** The localStorage key of the draft a keypad keeps under `draftKey`. */
export const keypadDraftStorageKey = (draftKey: string): string => `rimelog.keypad-draft.${draftKey}`;

/** Whether a draft written at `savedAt` may still be restored at `now`. */
export const isFreshDraft = (savedAt: number, now: number): boolean => now - savedAt <= keypadDraftMaxAgeMs;

/** The draft kept under `draftKey`, or null when there is none, it no longer fits, or it is too old (then it is dropped). */
export function readKeypadDraft(draftKey: string, now: number): KeypadDraft | null {
  const draft = readKept(keypadDraftStorageKey(draftKey), keypadDraftSchema);
  if (draft === null) return null;
  if (!isFreshDraft(draft.savedAt, now)) {
    clearKeypadDraft(draftKey);
    return null;
  }
  return draft;
}

export function writeKeypadDraft(draftKey: string, state: KeypadDraftState, now: number): void {
  const draft: KeypadDraft = { ...state, typedText: state.typedText.slice(0, maxTypedLength), savedAt: now };
  // `keep` catches and ignores a full or blocked storage: a lost draft must never stop the keys working.
  keep(keypadDraftStorageKey(draftKey), draft);
}

export function clearKeypadDraft(draftKey: string): void {
  forget(keypadDraftStorageKey(draftKey));
}
