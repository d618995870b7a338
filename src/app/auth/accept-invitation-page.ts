import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { describeLoadError } from '../core/describe-load-error';
import { AuthApi } from './auth-api';
import { newPasswordProblem } from './new-password';

/** Opened from the invitation e-mail: the new official chooses a password, then signs in. */
@Component({
  selector: 'rl-accept-invitation-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, RouterLink],
  templateUrl: './accept-invitation-page.html',
  styleUrl: './auth-page.scss',
})
export class AcceptInvitationPage {
  private readonly api = inject(AuthApi);
  /** From `?token=` in the invitation link. */
  readonly token = input<string>();

  protected readonly password = signal('');
  protected readonly repeated = signal('');
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);
  /** The address the new account signs in with, once accepted. */
  protected readonly acceptedEmail = signal<string | null>(null);

  protected async accept(): Promise<void> {
    const token = this.token();
    if (!token || this.busy()) return;
    const problem = newPasswordProblem(this.password(), this.repeated());
    this.problem.set(problem);
    if (problem) return;
    this.busy.set(true);
    try {
      this.acceptedEmail.set(await this.api.acceptInvitation(token, this.password()));
    } catch (error) {
      this.problem.set(describeLoadError(error));
    } finally {
      this.busy.set(false);
    }
  }
}
