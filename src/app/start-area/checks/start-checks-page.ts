import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { toSignal, toObservable } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { Router, RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import { FieldDataStore } from '../../core/field-data/field-data-store';
import { DeviceStore } from '../../core/sync/device-store';
import { outcomeMarks, usedValueSource } from '../verdict/verdict-words';
import { checkRows, checkStatusWords } from './check-words';
import { queueStateWords, startQueue, type QueueEntry } from './queue-state';

const lastRun = 20;

/** Where a problem is shown: beside the sled tapped, or under the typed bib. */
type ProblemAt = number | 'typed';

/**
 * The start checks of a competition on this device, and where a new one begins: the start queue of the
 * chosen run (the next sled in one tap), or a typed bib for a sled not on the list. A sled already checked
 * in that run opens its check again instead of a second one. No check begins while the rules say enough
 * controlled sleds already wait at the start; "Started" frees a place.
 */
@Component({
  selector: 'rl-start-checks-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, FormsModule, MatButtonModule, RouterLink],
  templateUrl: './start-checks-page.html',
  styleUrl: './start-checks.scss',
})
export class StartChecksPage {
  private readonly store = inject(DeviceStore);
  private readonly fieldDataStore = inject(FieldDataStore);
  private readonly router = inject(Router);
  /** The competition, from the route's `:id`. */
  readonly id = input.required<string>();

  private readonly records = toSignal(toObservable(this.id).pipe(switchMap((id) => this.store.watchRecords(id, 'start-check'))), { initialValue: [] });
  /** undefined while the device is still being read; null when it has no copy. */
  readonly fieldData = toSignal(toObservable(this.id).pipe(switchMap((id) => this.fieldDataStore.watch(id))));
  private readonly fieldDataFailure = computed(() => this.fieldDataStore.failureFor(this.id()));
  readonly fieldDataProblem = computed(() => this.fieldDataFailure()()?.message ?? null);
  readonly checks = computed(() => checkRows(this.records()));
  readonly statusWords = checkStatusWords;
  readonly run = signal(1);
  readonly queue = computed(() => {
    const data = this.fieldData();
    return startQueue({
      startList: data?.startList ?? [],
      checks: this.checks().filter((check) => check.run === this.run()),
      profile: data ? (data.profile?.profile ?? 'not-open') : null,
    });
  });
  readonly rulingMark = computed(() => outcomeMarks[this.queue().mayBegin.verdict?.outcome ?? 'not-judged']);
  readonly limitSource = computed(() => {
    const used = this.queue().mayBegin.verdict?.used[0];
    return used ? usedValueSource(used) : null;
  });
  readonly stateWords = queueStateWords;
  readonly bib = signal('');
  readonly busy = signal(false);
  readonly problem = signal<{ at: ProblemAt; text: string } | null>(null);
  /** The check whose start the official is asked to confirm. */
  readonly confirmingStart = signal<string | null>(null);
  readonly lastRun = lastRun;

  constructor() {
    // One visit with signal brings the start list and the rules onto the device; a failure keeps the old copy.
    effect(() => {
      const id = this.id();
      untracked(() => void this.fieldDataStore.refresh(id));
    });
  }

  changeRun(step: number): void {
    this.run.update((run) => Math.min(lastRun, Math.max(1, run + step)));
    this.problem.set(null);
    this.confirmingStart.set(null);
  }

  problemAt(at: ProblemAt): string | null {
    const problem = this.problem();
    return problem?.at === at ? problem.text : null;
  }

  /** One tap on a sled of the queue: its check begins and opens. */
  async checkSled(entry: QueueEntry): Promise<void> {
    if (entry.check) {
      await this.open(entry.check.id);
      return;
    }
    await this.beginNew(entry.bib, entry.bib);
  }

  /** The typed bib: a sled not on the list, or any sled when the list is not on this device. */
  async begin(): Promise<void> {
    const bib = Number(this.bib().trim());
    if (!Number.isInteger(bib) || bib < 1 || bib > 9999) {
      this.problem.set({ at: 'typed', text: 'Enter the bib number on the sled (1 to 9999).' });
      return;
    }
    const existing = this.checks().find((check) => check.run === this.run() && check.bib === bib);
    if (existing) {
      await this.open(existing.id);
      return;
    }
    if (await this.beginNew(bib, 'typed')) this.bib.set('');
  }

  askStarted(checkId: string): void {
    this.problem.set(null);
    this.confirmingStart.set(checkId);
  }

  /** The sled has left the start: it no longer waits, so the queue frees a place. */
  async started(entry: QueueEntry): Promise<void> {
    const check = entry.check;
    this.confirmingStart.set(null);
    if (!check) return;
    await this.saving(entry.bib, () => this.store.updateRecord(check.id, { startedAt: new Date().toISOString() }));
  }

  private async beginNew(bib: number, at: ProblemAt): Promise<boolean> {
    const ruling = this.queue().mayBegin;
    if (!ruling.allowed) {
      this.problem.set({ at, text: `Bib ${bib} cannot be checked yet. ${ruling.reason}` });
      return false;
    }
    const record = await this.saving(at, async () => {
      const { record } = await this.store.createRecord('start-check', this.id(), 'start', {
        run: this.run(),
        bib,
        sled: 1,
        status: 'in-progress',
        beganAt: new Date().toISOString(),
        startedAt: null,
        note: '',
      });
      return record;
    });
    if (!record) return false;
    await this.open(record.id);
    return true;
  }

  /** Runs one write with the buttons held; a failure is shown where the official tapped. */
  private async saving<T>(at: ProblemAt, write: () => Promise<T>): Promise<T | null> {
    this.busy.set(true);
    this.problem.set(null);
    try {
      return await write();
    } catch (error) {
      this.problem.set({ at, text: error instanceof Error ? error.message : String(error) });
      return null;
    } finally {
      this.busy.set(false);
    }
  }

  private async open(checkId: string): Promise<void> {
    await this.router.navigate(['/competitions', this.id(), 'start', 'checks', checkId]);
  }
}
