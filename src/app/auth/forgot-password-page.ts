import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { passwordResetRequestSchema } from '../../../shared/auth/auth-api';
import { describeLoadError } from '../core/describe-load-error';
import { AuthApi } from './auth-api';
import { firstProblem } from './form-problem';

/** Asks for a link to choose a new password; the answer is the same whether the account exists or not. */
@Component({
  selector: 'rl-forgot-password-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, RouterLink],
  templateUrl: './forgot-password-page.html',
  styleUrl: './auth-page.scss',
})
export class ForgotPasswordPage {
  private readonly api = inject(AuthApi);
  protected readonly email = signal('');
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly sentTo = signal<string | null>(null);

  protected async send(): Promise<void> {
    const email = this.email().trim();
    const problem = firstProblem(passwordResetRequestSchema, { email });
    this.problem.set(problem);
    if (problem || this.busy()) return;
    this.busy.set(true);
    try {
      await this.api.requestPasswordReset(email);
      this.sentTo.set(email);
    } catch (error) {
      this.problem.set(describeLoadError(error));
    } finally {
      this.busy.set(false);
    }
  }
}
