import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { NavigationEnd, Router, RouterOutlet } from '@angular/router';
import { filter, take } from 'rxjs';
import { AuthNotices } from './auth/auth-notices';
import { UserBar } from './auth/user-bar';
import { OfflineReadiness } from './core/offline-readiness';
import { StorageBanner } from './core/sync/storage-banner';
import { SyncStatusStrip } from './core/sync/sync-status-strip';
import { UpdatePrompt } from './core/sync/update-prompt';
import { ThemePreference } from './core/theme-preference';
import { LastScreen } from './start-area/last-screen';
import { FieldCautions } from './ui/field-cautions';
import { OfflineBadge } from './ui/offline-badge';

@Component({
  selector: 'rl-root',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [RouterOutlet, MatButtonModule, OfflineBadge, FieldCautions, UserBar, AuthNotices, SyncStatusStrip, UpdatePrompt, StorageBanner],
  templateUrl: './app.html',
  styleUrl: './app.scss',
})
export class App {
  protected readonly offline = inject(OfflineReadiness);
  protected readonly themes = inject(ThemePreference);

  constructor() {
    // After the first navigation: reopen the entry screen the app was killed on, if any.
    const lastScreen = inject(LastScreen);
    inject(Router)
      .events.pipe(
        filter((event) => event instanceof NavigationEnd),
        take(1),
      )
      .subscribe(() => void lastScreen.restoreAtStart());
  }
}
