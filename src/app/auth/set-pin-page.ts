import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { pinSchema } from '../../../shared/auth/auth-api';
import { describeLoadError } from '../core/describe-load-error';
import { AuthApi } from './auth-api';
import { AuthStore } from './auth-store';
import { DevicePins } from './device-pins';
import { DeviceUsers } from './device-users';
import { PinPad } from './pin-pad';
import { makePinVerifier } from './pin-verifier';
import { ServerReachability } from './server-reachability';

type Step = 'choose' | 'repeat' | 'saving' | 'done';

/**
 * Sets the official's PIN for this device, online and with their password. The device also keeps a
 * verifier of the PIN, so the official can take the device over with it where there is no signal.
 */
@Component({
  selector: 'rl-set-pin-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, PinPad, RouterLink],
  templateUrl: './set-pin-page.html',
  styleUrl: './auth-page.scss',
})
export class SetPinPage {
  private readonly api = inject(AuthApi);
  private readonly auth = inject(AuthStore);
  private readonly pins = inject(DevicePins);
  private readonly deviceUsers = inject(DeviceUsers);
  protected readonly isOffline = inject(ServerReachability).isOffline;
  protected readonly isHandOverPending = this.auth.isHandOverPending;
  protected readonly user = this.auth.user;
  protected readonly hadPin = computed(() => this.auth.me()?.hasPin ?? false);

  protected readonly password = signal('');
  protected readonly step = signal<Step>('choose');
  private readonly firstPin = signal('');
  protected readonly problem = signal<string | null>(null);

  protected choose(pin: string): void {
    const problem = pinProblem(pin);
    this.problem.set(problem);
    if (problem) return;
    this.firstPin.set(pin);
    this.step.set('repeat');
  }

  protected async confirm(pin: string): Promise<void> {
    if (pin !== this.firstPin()) {
      this.problem.set('The two PINs were not the same. Choose your PIN again.');
      this.startAgain();
      return;
    }
    if (this.password() === '') {
      this.problem.set('Enter your password first: it proves the PIN is yours.');
      return;
    }
    this.problem.set(null);
    this.step.set('saving');
    try {
      await this.api.setPin(this.password(), pin);
    } catch (error) {
      this.problem.set(describeLoadError(error));
      this.startAgain();
      return;
    }
    const me = this.auth.me();
    if (me) this.pins.save({ ...me, hasPin: true }, await makePinVerifier(pin));
    this.auth.notePinSet();
    this.password.set('');
    this.step.set('done');
    void this.deviceUsers.refresh();
  }

  protected startAgain(): void {
    this.firstPin.set('');
    this.step.set('choose');
  }
}

function pinProblem(pin: string): string | null {
  const result = pinSchema.safeParse(pin);
  return result.success ? null : (result.error.issues[0]?.message ?? 'A PIN is 4 to 6 digits.');
}
