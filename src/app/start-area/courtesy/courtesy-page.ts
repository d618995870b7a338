import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, linkedSignal, signal, viewChild } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { switchMap } from 'rxjs';
import { z } from 'zod';
import { athletesOf } from '../../../../shared/competition/start-list';
import { formatTenths, type Measurement } from '../../../../shared/rules/measurement';
import { judgeSteelTemperature } from '../../../../shared/rules/temperature';
import type { Verdict } from '../../../../shared/rules/verdict';
import { forget, keep, readKept } from '../../auth/local-json';
import { FieldDataStore } from '../../core/field-data/field-data-store';
import { DeviceStore } from '../../core/sync/device-store';
import { GloveKeypad } from '../../ui/glove-keypad/glove-keypad';
import { KEYPAD_DRAFT_CLOCK } from '../../ui/glove-keypad/keypad-draft-clock';
import { isFreshDraft } from '../../ui/glove-keypad/keypad-drafts';
import { controlLog, currentReadings } from '../control-steel/control-log';
import { VerdictCard } from '../verdict/verdict-card';
import { courtesyCheckOf, courtesyKeypads, courtesyLines } from './courtesy-check';

// The bib typed for the courtesy reading being keyed, kept with the keypad's draft so that after the
// app is killed the half-keyed value comes back with the athlete it belongs to.
const bibDraftKey = (competitionId: string) => `rimelog.courtesy-bib.${competitionId}`;
const bibDraftSchema = z.object({ bib: z.string().max(4), savedAt: z.number() });

interface Shown {
  bib: number;
  athletes: string;
  valueText: string;
  verdict: Verdict | null;
}

/**
 * Courtesy checks: an athlete's own reading before the official check, recorded apart from the checks,
 * shown to the athlete, and never counted as a violation.
 */
@Component({
  selector: 'rl-courtesy-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, FormsModule, MatButtonModule, GloveKeypad, VerdictCard],
  templateUrl: './courtesy-page.html',
  styleUrls: ['../checks/start-checks.scss', './courtesy-page.scss'],
})
export class CourtesyPage {
  private readonly store = inject(DeviceStore);
  private readonly fieldDataStore = inject(FieldDataStore);
  /** The competition, from the route's `:id`. */
  readonly id = input.required<string>();

  private readonly fieldData = toSignal(toObservable(this.id).pipe(switchMap((id) => this.fieldDataStore.watch(id))), { initialValue: null });
  private readonly controlRecords = toSignal(toObservable(this.id).pipe(switchMap((id) => this.store.watchRecords(id, 'control-reading'))), { initialValue: [] });
  private readonly courtesyRecords = toSignal(toObservable(this.id).pipe(switchMap((id) => this.store.watchRecords(id, 'courtesy-reading'))), { initialValue: [] });

  readonly what = computed(() => {
    const data = this.fieldData();
    return data ? courtesyCheckOf(data.competition) : null;
  });
  readonly keypad = computed(() => {
    const what = this.what();
    return what ? courtesyKeypads[what] : null;
  });
  readonly lines = computed(() => courtesyLines(this.courtesyRecords()));
  readonly hasFieldData = computed(() => this.fieldData() !== null);
  /** One courtesy keypad per competition on this device: its half-keyed value is kept under this name. */
  readonly draftKey = computed(() => `courtesy:${this.id()}`);
  private readonly now = inject(KEYPAD_DRAFT_CLOCK);
  readonly bib = linkedSignal(() => {
    const kept = readKept(bibDraftKey(this.id()), bibDraftSchema);
    return kept && isFreshDraft(kept.savedAt, this.now()) ? kept.bib : '';
  });
  readonly athlete = computed(() => {
    const bib = Number(this.bib().trim());
    return this.fieldData()?.startList.find((entry) => entry.bib === bib) ?? null;
  });
  readonly shown = signal<Shown | null>(null);
  readonly problem = signal<string | null>(null);
  readonly busy = signal(false);
  private readonly keypadView = viewChild(GloveKeypad);

  async save(tenths: number): Promise<void> {
    const what = this.what();
    const keypad = this.keypad();
    const entry = this.athlete();
    const data = this.fieldData();
    if (!what || !keypad || !data) return;
    if (!entry) {
      this.problem.set(`Enter the bib of a sled on the start list first${this.bib().trim() ? ` (bib ${this.bib().trim()} is not on it)` : ''}.`);
      return;
    }
    const value: Measurement = { tenths, unit: keypad.unit === 'kg' ? 'kilogram' : 'celsius' };
    const takenAt = new Date().toISOString();
    this.busy.set(true);
    this.problem.set(null);
    try {
      await this.store.createRecord('courtesy-reading', this.id(), 'start', { bib: entry.bib, what, value, takenAt, instrumentId: null, note: '' });
      this.shown.set({
        bib: entry.bib,
        athletes: athletesOf(entry),
        valueText: formatTenths(value.tenths, value.unit),
        verdict: what === 'steel temperature' && data.profile ? this.judge(value, takenAt, data.profile.profile) : null,
      });
      this.setBib('');
      // The next athlete starts from an empty keypad.
      this.keypadView()?.clear();
    } catch (error) {
      this.problem.set(error instanceof Error ? error.message : String(error));
    } finally {
      this.busy.set(false);
    }
  }

  /** Kept on the device at every change, like the keypad's draft; forgotten once it is empty. */
  setBib(bib: string): void {
    this.bib.set(bib);
    if (bib === '') forget(bibDraftKey(this.id()));
    else keep(bibDraftKey(this.id()), { bib, savedAt: this.now() });
  }

  private judge(reading: Measurement, takenAt: string, profile: Parameters<typeof judgeSteelTemperature>[0]['profile']): Verdict | null {
    try {
      return judgeSteelTemperature({ profile, steel: { reading, takenAt }, controlReadings: currentReadings(controlLog(this.controlRecords()).entries) });
    } catch {
      // A profile with a gap cannot judge; the athlete still sees the reading itself.
      return null;
    }
  }
}
