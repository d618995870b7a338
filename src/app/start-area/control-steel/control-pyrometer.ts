import { computed, signal, type Signal } from '@angular/core';
import type { FieldData } from '../../../../shared/competition/field-data';
import { instrumentChoices, keepChosenInstrument, localDay, readChosenInstrument } from '../checks/check-instruments';

const purposes = ['control-steel-pyrometer'] as const;

/**
 * The control steel pyrometer a reading is taken with, from the competition's instruments on this device:
 * only a calibrated control steel pyrometer issued to the official can be chosen; a sled pyrometer in their
 * pocket is listed with why not. Null choices while the instruments are not on the device.
 */
export function controlPyrometer(fieldData: Signal<FieldData | null | undefined>, userId: Signal<string | null>, now: Signal<number>) {
  const choices = computed(() => {
    const instruments = fieldData()?.instruments ?? [];
    return instruments.length === 0 ? null : instrumentChoices(instruments, userId(), purposes, localDay(now()));
  });
  const chosenId = signal(readChosenInstrument('control-steel-pyrometer'));
  const chosen = computed(() => choices()?.usable.find((instrument) => instrument.id === chosenId()) ?? null);
  return {
    choices,
    chosen,
    choose(id: string): void {
      chosenId.set(id);
      keepChosenInstrument('control-steel-pyrometer', id);
    },
    /** Checked again at the moment of the reading: a calibration can run out while the screen is open. */
    mayUse(id: string, at: number): boolean {
      const instruments = fieldData()?.instruments ?? [];
      return instrumentChoices(instruments, userId(), purposes, localDay(at)).usable.some((instrument) => instrument.id === id);
    },
    /** What is written on an instrument, for the log; a reading keyed before the instruments came shows what was typed. */
    labelOf(id: string): string {
      return fieldData()?.instruments.find((instrument) => instrument.id === id)?.label ?? id;
    },
  };
}
