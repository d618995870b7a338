import { computed, inject, Injectable, signal, type Signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { of, switchMap } from 'rxjs';
import { officialBodyWeightsOf } from '../../../../shared/competition/start-list';
import type { FieldData } from '../../../../shared/competition/field-data';
import type { InstrumentPurpose } from '../../../../shared/competition/instruments';
import type { RecordKind } from '../../../../shared/sync/record-kinds';
import { AuthStore } from '../../auth/auth-store';
import type { LocalRecord } from '../../core/device-store/device-db';
import { FieldDataStore } from '../../core/field-data/field-data-store';
import { DeviceStore } from '../../core/sync/device-store';
import { controlLog, currentReadings } from '../control-steel/control-log';
import { STEEL_READING_CLOCK } from '../steel-temperatures/steel-reading-clock';
import { checkAnswers, liveMeasurements, liveScaleProofs, valuesByPlace, weighed, dimensioned } from './check-records';
import { instrumentChoices, localDay, noInstrumentChoices, type InstrumentChoices } from './check-instruments';
import type { StepState } from './check-plan';
import { stepStates } from './check-progress';
import { savedSteelReadings, steelOutcome } from './check-steel';
import { checkRowOf } from './check-words';
import { judgeSpots } from '../steel-temperatures/steel-spots';

/** Whether this device can run the check's steps: the start list, instruments and frozen rules are needed. */
export type CheckSetup = 'loading' | 'no-field-data' | 'no-rules' | 'ready';

/**
 * Everything the steps of one start check read, in one place per check screen: the check, its records,
 * this device's copy of the start list, instruments and rules, and who is signed in. Provided by the check
 * page; each step host injects it and saves through the DeviceStore.
 */
@Injectable()
export class CheckSession {
  readonly store = inject(DeviceStore);
  private readonly fieldDataStore = inject(FieldDataStore);
  private readonly auth = inject(AuthStore);
  readonly clock = inject(STEEL_READING_CLOCK);

  private readonly ids = signal<{ competitionId: string; checkId: string } | null>(null);
  readonly competitionId = computed(() => this.ids()?.competitionId ?? '');
  readonly checkId = computed(() => this.ids()?.checkId ?? '');
  /** Keypad drafts of this check are kept under this scope, so each sled's half-keyed values stay its own. */
  readonly draftScope = computed(() => `check:${this.checkId()}`);
  private readonly competition$ = toObservable(computed(() => this.ids()?.competitionId ?? null));

  readonly checks = this.watch('start-check');
  readonly measurements = this.watch('measurement');
  readonly controlRecords = this.watch('control-reading');
  readonly violationRecords = this.watch('violation');
  readonly scaleProofRecords = this.watch('scale-proof');

  /** This device's copy of the start list, instruments and rules: undefined while it is read, null when there is none. */
  readonly fieldData = toSignal<FieldData | null | undefined, undefined>(
    this.competition$.pipe(switchMap((id) => (id ? this.fieldDataStore.watch(id) : of(undefined)))),
    { initialValue: undefined },
  );
  readonly profile = computed(() => this.fieldData()?.profile?.profile ?? null);
  readonly setup = computed<CheckSetup>(() => {
    const data = this.fieldData();
    if (data === undefined) return 'loading';
    if (data === null) return 'no-field-data';
    return data.profile === null ? 'no-rules' : 'ready';
  });

  readonly checkRecord = computed(() => this.checks()?.find((r) => r.id === this.checkId()) ?? null);
  readonly check = computed(() => {
    const record = this.checkRecord();
    return record ? checkRowOf(record) : null;
  });
  readonly isOpen = computed(() => this.check()?.status === 'in-progress');
  readonly answers = computed(() => {
    const record = this.checkRecord();
    return record ? checkAnswers(record) : null;
  });
  /** The start list entry of this check's bib, or null when the list on this device does not have it. */
  readonly entry = computed(() => this.fieldData()?.startList.find((e) => e.bib === this.check()?.bib) ?? null);
  readonly officialBodyWeights = computed(() => {
    const entry = this.entry();
    return entry ? officialBodyWeightsOf(entry) : null;
  });
  readonly controlReadings = computed(() => currentReadings(controlLog(this.controlRecords() ?? []).entries));

  readonly weights = computed(() => liveMeasurements(this.measurements() ?? [], this.checkId(), weighed));
  readonly weightValues = computed(() => valuesByPlace(this.weights()));
  readonly dimensions = computed(() => liveMeasurements(this.measurements() ?? [], this.checkId(), dimensioned));
  readonly scaleProofs = computed(() => liveScaleProofs(this.scaleProofRecords() ?? []));

  readonly savedSteel = computed(() => savedSteelReadings(this.measurements() ?? [], this.checkId()));
  readonly steelReadings = computed(() => this.savedSteel().map((saved) => saved.reading));
  readonly steel = computed(() => {
    const profile = this.profile();
    const readings = this.steelReadings();
    return steelOutcome(profile && readings.length > 0 ? judgeSpots(profile, this.controlReadings(), readings) : null, this.savedSteel());
  });

  /** The calibrated control weights issued to this official: those at the scale they prove. */
  readonly controlWeights = computed(() => this.controlWeightChoices().usable.map(({ id, label, nominalMass }) => ({ id, label, nominalMass })));
  private readonly controlWeightChoices = this.instruments(['control-weight']);

  /** Every step of the check that applies, with where it stands; empty until the check and the rules are on the device. */
  readonly steps = computed<StepState[]>(() => {
    const profile = this.profile();
    const check = this.check();
    const answers = this.answers();
    // Until every record the steps are judged from is read, nothing is listed (no step appears and vanishes).
    if (!profile || !check || !answers || this.measurements() === null || this.scaleProofRecords() === null) return [];
    return stepStates({
      profile,
      checkId: check.id,
      run: check.run,
      discipline: this.entry()?.discipline ?? null,
      officialBodyWeights: this.officialBodyWeights(),
      answers,
      weights: this.weights(),
      dimensions: this.dimensions(),
      scaleProofs: this.scaleProofs(),
      controlWeights: this.controlWeights(),
      steel: this.steel(),
      savedSteel: this.savedSteel(),
    });
  });

  bind(competitionId: string, checkId: string): void {
    const now = this.ids();
    if (now?.competitionId !== competitionId || now.checkId !== checkId) this.ids.set({ competitionId, checkId });
  }

  /** The instruments the signed-in official may take readings of `purposes` with today, and those refused with why. */
  instruments(purposes: readonly InstrumentPurpose[]): Signal<InstrumentChoices> {
    return computed(() => {
      const data = this.fieldData();
      return data ? instrumentChoices(data.instruments, this.auth.activeUserId(), purposes, localDay(this.clock())) : noInstrumentChoices;
    });
  }

  /** Checked again at the moment of a reading: a calibration can run out while the screen is open. */
  mayUse(instrumentId: string | null, purposes: readonly InstrumentPurpose[], at: string): boolean {
    if (instrumentId === null) return false;
    const choices = instrumentChoices(this.fieldData()?.instruments ?? [], this.auth.activeUserId(), purposes, localDay(Date.parse(at)));
    return choices.usable.some((instrument) => instrument.id === instrumentId);
  }

  private watch(kind: RecordKind): Signal<LocalRecord[] | null> {
    return toSignal<LocalRecord[] | null, null>(
      this.competition$.pipe(switchMap((id) => (id ? this.store.watchRecords(id, kind) : of(null)))),
      { initialValue: null },
    );
  }
}
