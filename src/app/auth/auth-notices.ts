import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { AuthStore } from './auth-store';

/** Gentle notices under the header: the sign-in ending soon, or a PIN hand-over the server has not seen. */
@Component({
  selector: 'rl-auth-notices',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, RouterLink],
  template: `
    @if (auth.isSignedIn()) {
      @let expiry = auth.expiry();
      @if (expiry.kind !== 'fine') {
        <p class="notice" role="status" [attr.data-kind]="expiry.kind">
          <strong>{{ expiry.kind === 'ended' ? 'Sign-in ended.' : 'Sign-in ends soon.' }}</strong> {{ expiry.text }}
          <br />
          <a mat-stroked-button routerLink="/sign-in">Sign in again</a>
        </p>
      }
      @if (auth.isHandOverPending()) {
        <p class="notice" role="status">
          <strong>{{ auth.user()?.displayName }} took over this device with no signal.</strong> What you record now
          carries your name. The server still has {{ auth.serverUser()?.displayName }} signed in here; with a signal
          it follows, or choose your own name under “Switch official”.
        </p>
      }
    }
  `,
  styles: `
    :host {
      display: block;
      max-width: 1100px;
      margin: 0 auto;
      width: 100%;
      box-sizing: border-box;
    }
    .notice {
      margin: 12px 16px 0;
      padding: 12px 16px;
      border: 2px solid var(--mat-sys-outline);
      border-radius: 8px;
      font-size: 1.05rem;
    }
    .notice a {
      margin-top: 12px;
    }
  `,
})
export class AuthNotices {
  protected readonly auth = inject(AuthStore);
}
