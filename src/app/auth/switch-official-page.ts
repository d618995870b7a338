import { ChangeDetectionStrategy, Component, type OnInit, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { Router, RouterLink } from '@angular/router';
import { AuthStore } from './auth-store';
import { DevicePins } from './device-pins';
import { DeviceUsers } from './device-users';
import { OfficialSwitch, type SwitchOutcome } from './official-switch';
import { PinPad } from './pin-pad';
import { ServerReachability } from './server-reachability';

interface Candidate {
  id: string;
  displayName: string;
  /** A verifier of their PIN is kept here, so they can switch in with no signal. */
  canSwitchOffline: boolean;
}

/** "Who is using this device?": another official who set a PIN here takes over with it. */
@Component({
  selector: 'rl-switch-official-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, PinPad, RouterLink],
  templateUrl: './switch-official-page.html',
  styleUrls: ['./auth-page.scss', './switch-official-page.scss'],
})
export class SwitchOfficialPage implements OnInit {
  private readonly auth = inject(AuthStore);
  private readonly pins = inject(DevicePins);
  private readonly deviceUsers = inject(DeviceUsers);
  private readonly officialSwitch = inject(OfficialSwitch);
  private readonly router = inject(Router);
  private readonly reachability = inject(ServerReachability);

  protected readonly current = this.auth.user;
  protected readonly currentHasPin = computed(() => this.auth.me()?.hasPin ?? false);
  protected readonly isOffline = this.reachability.isOffline;
  protected readonly candidates = computed<Candidate[]>(() => {
    const kept = this.pins.all();
    const byId = new Map<string, Candidate>();
    for (const user of this.deviceUsers.list()) byId.set(user.id, { ...user, canSwitchOffline: user.id in kept });
    for (const [id, pin] of Object.entries(kept)) {
      if (!byId.has(id)) byId.set(id, { id, displayName: pin.me.user.displayName, canSwitchOffline: true });
    }
    // While the server still knows someone else here, the official using the device may pick their own
    // name again to move the server's sign-in to them (an app restart forgets the PIN that would do it).
    const keepCurrent = this.auth.isHandOverPending();
    return [...byId.values()]
      .filter((candidate) => keepCurrent || candidate.id !== this.current()?.id)
      .sort((a, b) => a.displayName.localeCompare(b.displayName));
  });
  protected readonly chosen = signal<Candidate | null>(null);
  protected readonly checking = signal(false);
  protected readonly isLocked = computed(() => this.outcome()?.kind === 'locked');
  protected readonly outcome = signal<SwitchOutcome | null>(null);
  protected readonly refusal = computed(() => {
    const outcome = this.outcome();
    const name = this.chosen()?.displayName ?? '';
    return outcome ? describeRefusal(outcome, name) : null;
  });

  ngOnInit(): void {
    if (!this.isOffline()) void this.deviceUsers.refresh();
  }

  protected choose(candidate: Candidate | null): void {
    this.chosen.set(candidate);
    const lockedUntil = candidate ? this.pins.lockedUntil(candidate.id, Date.now()) : null;
    this.outcome.set(lockedUntil === null ? null : { kind: 'locked', until: new Date(lockedUntil) });
  }

  protected async switchTo(pin: string): Promise<void> {
    const candidate = this.chosen();
    if (!candidate || this.checking()) return;
    this.checking.set(true);
    this.outcome.set(null);
    try {
      const outcome = await this.officialSwitch.switchTo(candidate.id, pin);
      this.outcome.set(outcome);
      if (outcome.kind === 'switched') await this.router.navigateByUrl('/');
    } finally {
      this.checking.set(false);
    }
  }
}

/** Why a switch did not happen, in words; null when it did. */
export function describeRefusal(outcome: SwitchOutcome, name: string): { title: string; detail: string } | null {
  switch (outcome.kind) {
    case 'switched':
      return null;
    case 'wrong-pin':
      return {
        title: 'That PIN is not right.',
        detail: `${outcome.triesLeft} ${outcome.triesLeft === 1 ? 'try' : 'tries'} left before a 5-minute pause.`,
      };
    case 'locked': {
      const at = outcome.until.toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });
      return {
        title: `Too many wrong PINs for ${name}.`,
        detail: `PIN tries are paused until ${at}. Wait, or sign in with the password.`,
      };
    }
    case 'needs-signal':
      return {
        title: 'Switching needs a signal this time.',
        detail: `No PIN for ${name} is kept on this device yet; try again where there is Wi-Fi.`,
      };
    case 'refused':
      return { title: 'Not switched.', detail: outcome.message };
  }
}
