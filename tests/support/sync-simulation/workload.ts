import type { WriteResult } from '../../../src/app/core/device-store/record-writer';
import { openRaceId } from '../sync-ops';
import type { Ledger } from './ledger';
import type { Random } from './prng';
import type { SimDevice } from './sim-device';

/** Start checks of the shared records are run 19, bibs 1, 2, ...; contested sleds run 20; own checks run 1. */
const sharedRun = 19;
const contestedRun = 20;
const editTimeBase = Date.parse('2027-01-09T12:00:00.000Z');

export const sharedCheckFields = (n: number) => ({ run: sharedRun, bib: n + 1, status: 'in-progress', beganAt: '2027-01-09T09:00:00.000Z', note: '' });

type Action = 'reading' | 'measurement' | 'own-check' | 'correction' | 'contested-check' | 'remove-own-check' | 'shared-edit';
const actions: readonly Action[] = ['reading', 'measurement', 'own-check', 'correction', 'contested-check', 'remove-own-check', 'shared-edit'];
/** Mostly new readings and measurements; edits go to a few shared start checks. */
const weights = [38, 26, 6, 4, 3, 1, 22];
/** The first shared check is edited most. */
const sharedWeights = [4, 3, 2, 1, 1, 1, 1, 1];

/**
 * What one official records offline, drawn from the device's own random stream, written through the
 * real record writer and logged in the ledger once its transaction has committed.
 */
export class DeviceWorkload {
  private ownChecks: string[] = [];
  private removable: string[] = [];
  /** Readings and measurements of this device not yet corrected. */
  private correctable: string[] = [];
  private contestedDone = new Set<number>();
  private edits = 0;

  constructor(
    private readonly device: SimDevice,
    private readonly random: Random,
    private readonly ledger: Ledger,
    private readonly shared: readonly string[],
    private readonly contestedSleds: number,
    /** Ops this device made before (the shared start checks). */
    public made = 0,
  ) {}

  /** Makes the next change of this official. */
  async next(): Promise<void> {
    const { writer, userId } = this.device;
    const action = actions[this.random.weighted(weights)]!;
    const time = new Date(editTimeBase - 3_600_000 + this.made * 1_000).toISOString();
    switch (action) {
      case 'own-check': {
        const result = await this.log(writer.createRecord('start-check', openRaceId, 'start', { run: 1, bib: (this.device.index + 1) * 1000 + this.ownChecks.length, status: 'in-progress', beganAt: time, note: '' }, userId));
        this.ownChecks.push(result.record.id);
        this.removable.push(result.record.id);
        return;
      }
      case 'contested-check': {
        const free = Array.from({ length: this.contestedSleds }, (_, n) => n + 1).filter((bib) => !this.contestedDone.has(bib));
        if (free.length === 0) return this.reading(time);
        const bib = this.random.pick(free);
        this.contestedDone.add(bib);
        await this.log(writer.createRecord('start-check', openRaceId, 'start', { run: contestedRun, bib, status: 'in-progress', beganAt: time, note: `device ${this.device.index}` }, userId));
        return;
      }
      case 'measurement': {
        const checkId = this.random.pick([...this.ownChecks, ...this.shared]);
        const result = await this.log(
          writer.createRecord('measurement', openRaceId, 'start', { checkId, what: 'runner width', value: { tenths: this.random.int(2_000, 2_200), unit: 'millimetre' }, takenAt: time }, userId),
        );
        this.correctable.push(result.record.id);
        return;
      }
      case 'correction': {
        if (this.correctable.length === 0) return this.reading(time);
        const id = this.correctable.splice(this.random.int(0, this.correctable.length - 1), 1)[0]!;
        const old = await this.device.db.records.get(id);
        const changed = old?.kind === 'measurement' ? { value: { tenths: this.random.int(2_000, 2_200), unit: 'millimetre' } } : { reading: { tenths: this.random.int(-200, 0), unit: 'celsius' } };
        const result = await this.log(writer.correctRecord(id, changed, 'read again with the instrument held still', userId));
        this.correctable.push(result.record.id);
        return;
      }
      case 'remove-own-check': {
        if (this.removable.length === 0) return this.reading(time);
        const id = this.removable.splice(this.random.int(0, this.removable.length - 1), 1)[0]!;
        await this.log(writer.deleteRecord(id, userId));
        return;
      }
      case 'shared-edit':
        return this.sharedEdit();
      case 'reading':
        return this.reading(time);
    }
  }

  private async reading(time: string): Promise<void> {
    const result = await this.log(
      this.device.writer.createRecord('control-reading', openRaceId, 'start', { reading: { tenths: this.random.int(-200, 0), unit: 'celsius' }, takenAt: time, instrumentId: `pyrometer-${this.device.index}` }, this.device.userId),
    );
    this.correctable.push(result.record.id);
  }

  /** A new note, a new time the check began, or both: values no other edit ever gives, so each names its edit. */
  private async sharedEdit(): Promise<void> {
    const recordId = this.shared[this.random.weighted(sharedWeights.slice(0, this.shared.length))]!;
    this.edits++;
    const note = `device ${this.device.index}, edit ${this.edits}`;
    const beganAt = new Date(editTimeBase + (this.device.index * 100_000 + this.edits) * 1_000).toISOString();
    const which = this.random.weighted([45, 35, 20]);
    const changes = which === 0 ? { note } : which === 1 ? { beganAt } : { note, beganAt };
    await this.log(this.device.writer.updateRecord(recordId, changes, this.device.userId));
  }

  private async log(write: Promise<WriteResult>): Promise<WriteResult> {
    const result = await logged(this.device, this.ledger, write);
    this.made++;
    return result;
  }
}

async function logged(device: SimDevice, ledger: Ledger, write: Promise<WriteResult>): Promise<WriteResult> {
  const result = await write;
  if (!result.op) throw new Error(`Device ${device.index} made a change that queued no op.`);
  ledger.record(device.index, result.op);
  return result;
}

/** The first device's first records: the shared start checks every device edits later. */
export async function createSharedChecks(device: SimDevice, ledger: Ledger, count: number): Promise<string[]> {
  const ids: string[] = [];
  for (let n = 0; n < count; n++) ids.push((await logged(device, ledger, device.writer.createRecord('start-check', openRaceId, 'start', sharedCheckFields(n), device.userId))).record.id);
  return ids;
}
