import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';

/**
 * What the last save of a step said: saved on this device (with the time), or not saved and why. Saves run
 * one after the other, in the order they were asked for, so each reads what the one before it wrote.
 */
export class SaveNotice {
  readonly saved = signal<string | null>(null);
  readonly problem = signal<string | null>(null);
  readonly busy = signal(false);
  /** Goes up with every save refused or failed: a step keyed on it starts afresh, so no unsaved value stays on screen. */
  readonly round = signal(0);
  private queue: Promise<unknown> = Promise.resolve();

  /** Runs one save after those before it; the words say what was saved. Never throws: a failure is shown in words. */
  run(change: () => Promise<unknown>, words: string): Promise<boolean> {
    const done = this.queue.then(() => this.attempt(change, words));
    this.queue = done;
    return done;
  }

  private async attempt(change: () => Promise<unknown>, words: string): Promise<boolean> {
    this.busy.set(true);
    this.problem.set(null);
    try {
      await change();
      this.saved.set(`${words} ${timeNow()}`);
      return true;
    } catch (error) {
      this.saved.set(null);
      this.problem.set(error instanceof Error ? error.message : String(error));
      this.round.update((n) => n + 1);
      return false;
    } finally {
      this.busy.set(false);
    }
  }

  refuse(words: string): void {
    this.saved.set(null);
    this.problem.set(words);
    this.round.update((n) => n + 1);
  }
}

const timeNow = () => new Date().toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' });

@Component({
  selector: 'rl-save-notice',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (notice().saved(); as text) {
      <p class="saved" role="status">✓ {{ text }}</p>
    }
    @if (notice().problem(); as text) {
      <p class="problem" role="alert"><strong>⚠ Not saved.</strong> {{ text }}</p>
    }
  `,
  styles: `
    :host {
      display: contents;
    }
    p {
      margin: 0;
      font-size: 1.1rem;
    }
    .saved {
      font-weight: 700;
    }
    .problem {
      padding: 12px 16px;
      border: 3px solid var(--mat-sys-outline);
      border-radius: 8px;
    }
  `,
})
export class SaveNoticeView {
  readonly notice = input.required<SaveNotice>();
}
