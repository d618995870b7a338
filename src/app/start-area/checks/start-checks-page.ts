import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toSignal, toObservable } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { Router, RouterLink } from '@angular/router';
import { switchMap } from 'rxjs';
import { DeviceStore } from '../../core/sync/device-store';
import { FieldCautions } from '../../ui/field-cautions';
import { checkRows, checkStatusWords } from './check-words';

const lastRun = 20;

/**
 * The start checks of a competition on this device, and where a new one begins: the run and the bib,
 * then the check screen. A sled already checked in that run opens its check again instead of a second one.
 */
@Component({
  selector: 'rl-start-checks-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, FormsModule, MatButtonModule, RouterLink, FieldCautions],
  templateUrl: './start-checks-page.html',
  styleUrl: './start-checks.scss',
})
export class StartChecksPage {
  private readonly store = inject(DeviceStore);
  private readonly router = inject(Router);
  /** The competition, from the route's `:id`. */
  readonly id = input.required<string>();

  private readonly records = toSignal(toObservable(this.id).pipe(switchMap((id) => this.store.watchRecords(id, 'start-check'))), { initialValue: [] });
  readonly checks = computed(() => checkRows(this.records()));
  readonly statusWords = checkStatusWords;
  readonly run = signal(1);
  readonly bib = signal('');
  readonly busy = signal(false);
  readonly problem = signal<string | null>(null);
  readonly lastRun = lastRun;

  changeRun(step: number): void {
    this.run.update((run) => Math.min(lastRun, Math.max(1, run + step)));
  }

  async begin(): Promise<void> {
    const bib = Number(this.bib().trim());
    if (!Number.isInteger(bib) || bib < 1 || bib > 9999) {
      this.problem.set('Enter the bib number on the sled (1 to 9999).');
      return;
    }
    const existing = this.checks().find((check) => check.run === this.run() && check.bib === bib);
    if (existing) {
      await this.open(existing.id);
      return;
    }
    this.busy.set(true);
    this.problem.set(null);
    try {
      const { record } = await this.store.createRecord('start-check', this.id(), 'start', {
        run: this.run(),
        bib,
        status: 'in-progress',
        beganAt: new Date().toISOString(),
        note: '',
      });
      this.bib.set('');
      await this.open(record.id);
    } catch (error) {
      this.problem.set(error instanceof Error ? error.message : String(error));
    } finally {
      this.busy.set(false);
    }
  }

  private async open(checkId: string): Promise<void> {
    await this.router.navigate(['/competitions', this.id(), 'start', 'checks', checkId]);
  }
}
