import { computed, signal } from '@angular/core';
import type { InstrumentPurpose } from '../../../../../shared/competition/instruments';
import { keepChosenInstrument, readChosenInstrument } from '../check-instruments';
import type { CheckSession } from '../check-session';

/**
 * The instrument a step reads with: the choices for `purposes`, the one chosen on this device last time
 * (while the official may still use it), and a way to choose another.
 */
export function chosenInstrument(session: CheckSession, purposes: readonly InstrumentPurpose[]) {
  const rememberAs = purposes[0]!;
  const choices = session.instruments(purposes);
  const chosenId = signal(readChosenInstrument(rememberAs));
  const chosen = computed(() => choices().usable.find((instrument) => instrument.id === chosenId()) ?? null);
  return {
    purposes,
    choices,
    chosen,
    choose(id: string): void {
      chosenId.set(id);
      keepChosenInstrument(rememberAs, id);
    },
  };
}

export type ChosenInstrument = ReturnType<typeof chosenInstrument>;
