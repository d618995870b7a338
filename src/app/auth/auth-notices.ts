import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { AuthStore } from './auth-store';

/** Gentle notices under the header: the sign-in ending soon, or a PIN hand-over the server has not seen. */
@Component({
  selector: 'rl-auth-notices',
  host: { class: 'rl-notice-strip' },
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, RouterLink],
  template: `
    @if (auth.isSignedIn()) {
      @let expiry = auth.expiry();
      @if (expiry.kind !== 'fine') {
        <p class="rl-notice notice" role="status" [attr.data-kind]="expiry.kind">
          <strong>{{ expiry.kind === 'ended' ? 'Sign-in ended.' : 'Sign-in ends soon.' }}</strong> {{ expiry.text }}
          <br />
          <a mat-stroked-button routerLink="/sign-in">Sign in again</a>
        </p>
      }
      @if (auth.isHandOverPending()) {
        <p class="rl-notice notice" role="status">
          <strong>{{ auth.user()?.displayName }} took over this device with no signal.</strong> What you record now
          carries your name. The server still has {{ auth.serverUser()?.displayName }} signed in here; with a signal
          it follows, or choose your own name under “Switch official”.
        </p>
      }
    }
  `,
  styles: `
    .notice a {
      margin-top: 12px;
    }
  `,
})
export class AuthNotices {
  protected readonly auth = inject(AuthStore);
}
