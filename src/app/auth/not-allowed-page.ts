import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterLink } from '@angular/router';
import { AuthStore } from './auth-store';
import { rolesInWords } from './role-words';

/** Where a guard sends an official whose role does not open a screen, with what they can do next. */
@Component({
  selector: 'rl-not-allowed-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, RouterLink],
  template: `
    <h1>Not for your role</h1>
    <p class="notice">
      <strong>{{ name() }}</strong>, your role ({{ roles() }}) does not open that screen. Ask the organiser if you
      need it, or hand the device to the official who does.
    </p>
    <div class="more-links">
      <a mat-flat-button class="primary-action" routerLink="/">Back to the competitions</a>
      <a mat-stroked-button routerLink="/switch-official">Switch official</a>
    </div>
  `,
  styleUrl: './auth-page.scss',
})
export class NotAllowedPage {
  private readonly auth = inject(AuthStore);
  protected readonly name = computed(() => this.auth.user()?.displayName ?? 'Signed out');
  protected readonly roles = computed(() => rolesInWords(this.auth.roles()));
}
