import { ChangeDetectionStrategy, Component, type OnInit, inject, input, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';
import { signInRequestSchema } from '../../../shared/auth/auth-api';
import { describeLoadError } from '../core/describe-load-error';
import { AuthStore } from './auth-store';
import { DeviceUsers } from './device-users';
import { firstProblem, safeReturnUrl } from './form-problem';

/** E-mail and password, once at the hut; then back to the page the official was going to. */
@Component({
  selector: 'rl-sign-in-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, RouterLink],
  templateUrl: './sign-in-page.html',
  styleUrl: './auth-page.scss',
})
export class SignInPage implements OnInit {
  private readonly auth = inject(AuthStore);
  private readonly deviceUsers = inject(DeviceUsers);
  private readonly router = inject(Router);

  /** From `?returnUrl=`: where a guard stopped the official. */
  readonly returnUrl = input<string>();
  /** From `?email=`: filled in after accepting an invitation. */
  readonly email = input<string>();

  protected readonly emailTyped = signal('');
  protected readonly password = signal('');
  protected readonly showPassword = signal(false);
  protected readonly busy = signal(false);
  protected readonly problem = signal<string | null>(null);
  protected readonly sessionHasEnded = this.auth.sessionHasEnded;

  ngOnInit(): void {
    const email = this.email();
    if (email) this.emailTyped.set(email);
  }

  protected async signIn(): Promise<void> {
    const email = this.emailTyped().trim();
    const password = this.password();
    const problem = firstProblem(signInRequestSchema, { email, password, deviceId: this.auth.deviceId });
    this.problem.set(problem);
    if (problem || this.busy()) return;
    this.busy.set(true);
    try {
      await this.auth.signIn(email, password);
    } catch (error) {
      this.problem.set(describeLoadError(error));
      return;
    } finally {
      this.busy.set(false);
    }
    void this.deviceUsers.refresh();
    await this.router.navigateByUrl(safeReturnUrl(this.returnUrl()));
  }
}
