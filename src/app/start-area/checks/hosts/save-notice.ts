import { ChangeDetectionStrategy, Component, input, signal } from '@angular/core';

/** What the last save of a step said: saved on this device (with the time), or not saved and why. */
export class SaveNotice {
  readonly saved = signal<string | null>(null);
  readonly problem = signal<string | null>(null);
  readonly busy = signal(false);

  /** Runs one save; the words say what was saved. Never throws: a failure is shown in words. */
  async run(change: () => Promise<unknown>, words: string): Promise<boolean> {
    this.busy.set(true);
    this.problem.set(null);
    try {
      await change();
      this.saved.set(`${words} ${timeNow()}`);
      return true;
    } catch (error) {
      this.saved.set(null);
      this.problem.set(error instanceof Error ? error.message : String(error));
      return false;
    } finally {
      this.busy.set(false);
    }
  }

  refuse(words: string): void {
    this.saved.set(null);
    this.problem.set(words);
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
