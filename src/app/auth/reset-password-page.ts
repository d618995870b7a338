import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { describeLoadError } from '../core/describe-load-error';
import { AuthApi } from './auth-api';
import { AuthStore } from './auth-store';
import { newPasswordProblem } from './new-password';

/** Opened from the password-reset e-mail: choose a new password; every device is then signed out. */
@Component({
  selector: 'rl-reset-password-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, RouterLink],
  templateUrl: './reset-password-page.html',
  styleUrl: './auth-page.scss',
})
export class ResetPasswordPage {
  private readonly api = inject(AuthApi);
  private readonly auth = inject(AuthStore);
  /** From `?token=` in the reset link. */
  readonly token = input<string>();

  protected readonly password = signal('');
  protected readonly repeated = signal('');
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly isDone = signal(false);

  protected async reset(): Promise<void> {
    const token = this.token();
    if (!token || this.busy()) return;
    const problem = newPasswordProblem(this.password(), this.repeated());
    this.problem.set(problem);
    if (problem) return;
    this.busy.set(true);
    try {
      await this.api.confirmPasswordReset(token, this.password());
      this.isDone.set(true);
    } catch (error) {
      this.problem.set(describeLoadError(error));
      return;
    } finally {
      this.busy.set(false);
    }
    // The reset ended that official's sessions; if this device had one, it learns so now.
    void this.auth.refresh();
  }
}
