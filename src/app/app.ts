import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { RouterOutlet } from '@angular/router';
import { AuthNotices } from './auth/auth-notices';
import { UserBar } from './auth/user-bar';
import { OfflineReadiness } from './core/offline-readiness';
import { StorageBanner } from './core/sync/storage-banner';
import { SyncStatusStrip } from './core/sync/sync-status-strip';
import { UpdatePrompt } from './core/sync/update-prompt';
import { ThemePreference } from './core/theme-preference';
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
}
