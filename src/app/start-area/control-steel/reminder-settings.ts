import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { ControlSteelReminder } from './control-steel-reminder';

/**
 * Whether reminders reach the official outside the app, in words, with a glove-sized "Allow reminders"
 * while the browser has not been asked yet, and what happens when notifications are refused.
 */
@Component({
  selector: 'rl-reminder-settings',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  templateUrl: './reminder-settings.html',
  styleUrl: './reminder-settings.scss',
})
export class ReminderSettings {
  protected readonly reminder = inject(ControlSteelReminder);
  protected readonly isAsking = signal(false);

  constructor() {
    this.reminder.refreshPermission();
  }

  protected async allow(): Promise<void> {
    if (this.isAsking()) return;
    this.isAsking.set(true);
    try {
      await this.reminder.askPermission();
    } finally {
      this.isAsking.set(false);
    }
  }
}
