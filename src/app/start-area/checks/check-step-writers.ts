import { firstValueFrom } from 'rxjs';
import type { Measurement } from '../../../../shared/rules/measurement';
import type { Verdict } from '../../../../shared/rules/verdict';
import { recordFieldSchemas } from '../../../../shared/sync/record-kinds';
import type { LocalRecord } from '../../core/device-store/device-db';
import type { WriteResult } from '../../core/device-store/record-writer';
import type { DeviceStore } from '../../core/sync/device-store';
import { stepRules, type StepState } from './check-plan';
import { liveMeasurements, liveScaleProofs, measurementAt, type SavedScaleProof } from './check-records';
import { isAlreadyReported, steelViolationFields, type FailedSpot } from './check-steel';

const violationFields = recordFieldSchemas.violation;
const measuredMax = violationFields.shape.measured.maxLength ?? 200;
const idsMax = 20;

export interface MeasurementToSave {
  competitionId: string;
  checkId: string;
  what: string;
  place: string | null;
  value: Measurement;
  instrumentId: string;
  takenAt: string;
}

/**
 * Saves one measurement of a check. Measuring the same place again corrects the value saved there, so the
 * earlier value stays as evidence (measurements are never edited). Reads the records afresh, so call one at a time.
 */
export async function saveMeasurement(store: DeviceStore, m: MeasurementToSave): Promise<WriteResult> {
  const saved = liveMeasurements(await firstValueFrom(store.watchRecords(m.competitionId, 'measurement')), m.checkId, m.what);
  const fields = { checkId: m.checkId, what: m.what, place: m.place, value: m.value, takenAt: m.takenAt, instrumentId: m.instrumentId };
  const again = measurementAt(saved, m.place);
  return again ? store.correctRecord(again.id, fields, 'measured again') : store.createRecord('measurement', m.competitionId, 'start', fields);
}

/** A proof as saved, less its record id; made in a check, of a competition. */
export type ScaleProofToSave = Omit<SavedScaleProof, 'id' | 'checkId'> & { competitionId: string; checkId: string };

/** Saves a scale proof; proving again in the same check corrects the proof made there. Reads the records afresh. */
export async function saveScaleProof(store: DeviceStore, p: ScaleProofToSave): Promise<WriteResult> {
  const latest = liveScaleProofs(await firstValueFrom(store.watchRecords(p.competitionId, 'scale-proof'))).filter((proof) => proof.run === p.run).at(-1) ?? null;
  const fields = {
    run: p.run,
    scaleId: p.scaleId,
    controlWeightIds: p.controlWeightIds,
    knownWeight: { tenths: p.knownTenths, unit: 'kilogram' },
    reading: { tenths: p.readingTenths, unit: 'kilogram' },
    takenAt: p.takenAt,
    checkId: p.checkId,
  };
  return latest && latest.checkId === p.checkId
    ? store.correctRecord(latest.id, fields, 'proved again')
    : store.createRecord('scale-proof', p.competitionId, 'start', fields);
}

/**
 * Records one violation per failed step (once: a violation already recorded for the same rule and
 * measurements is not recorded again), then sets the check's result to "violation".
 */
export async function reportViolations(
  store: DeviceStore,
  competitionId: string,
  checkId: string,
  failed: readonly StepState[],
  failedSpots: readonly FailedSpot[],
): Promise<void> {
  const violations = await firstValueFrom(store.watchRecords(competitionId, 'violation'));
  for (const step of failed) {
    if (step.id === 'steel') {
      if (failedSpots.length > 0 && !isAlreadyReported(violations, checkId, failedSpots)) {
        await store.createRecord('violation', competitionId, 'start', steelViolationFields(checkId, failedSpots));
      }
      continue;
    }
    const fields = stepViolationFields(checkId, step);
    if (fields && !isStepReported(violations, fields)) await store.createRecord('violation', competitionId, 'start', fields);
  }
  await store.updateRecord(checkId, { status: 'violation' });
}

/** The violation record of a failed step other than the steel temperatures; null for steps that name no rule. */
export function stepViolationFields(checkId: string, step: StepState) {
  if (step.id === 'steel' || step.id === 'scale-proof' || step.failed.length === 0) return null;
  return {
    checkId,
    rule: stepRules[step.id],
    measured: fitted(step.failed.map(numbersInWords)),
    measurementIds: step.measurementIds.slice(-idsMax),
    instrumentId: step.instrumentId,
    note: step.failed.map((verdict) => verdict.reason).join('\n'),
    decision: 'pending' as const,
  };
}

const numbersInWords = (verdict: Verdict): string => verdict.numbers.map((n) => `${n.label} ${n.text}`).join(', ');

/** As many parts as fit the record's field; the note keeps every reason. */
function fitted(parts: readonly string[]): string {
  const words = parts.join('; ');
  return words.length <= measuredMax ? words : `${words.slice(0, measuredMax - 16)}… (see the note)`;
}

function isStepReported(violations: readonly LocalRecord[], fields: NonNullable<ReturnType<typeof stepViolationFields>>): boolean {
  const ids = [...fields.measurementIds].sort().join();
  return violations.some((record) => {
    const parsed = violationFields.safeParse(record.fields);
    return !record.deleted && parsed.success && parsed.data.checkId === fields.checkId && parsed.data.rule === fields.rule && [...parsed.data.measurementIds].sort().join() === ids;
  });
}
