import { DOCUMENT, DestroyRef, Injectable, computed, inject, signal } from '@angular/core';
import { Router } from '@angular/router';
import { z } from 'zod';
import { meSchema, type Me } from '../../../shared/auth/auth-api';
import { hasRole, roles as allRoles, type Role } from '../../../shared/auth/roles';
import { AuthApi } from './auth-api';
import { deviceId } from './device-id';
import { DevicePins } from './device-pins';
import { forget, keep, readKept } from './local-json';
import { isNoConnection, isStatus, ServerReachability } from './server-reachability';
import { describeSessionExpiry, type SessionExpiry } from './session-expiry';

const sessionKey = 'rimelog.auth.session';
const activeKey = 'rimelog.auth.active';
const signOutOwedKey = 'rimelog.auth.sign-out-owed';

/**
 * Who is signed in on this device and who is using it now. Both are kept in localStorage, so after one
 * sign-in at the hut the app knows its official all race day with no network: a failed connection
 * never signs anyone out; only the server saying the session has ended (401) does.
 *
 * The two differ after an offline PIN switch: the server's session still belongs to the official who
 * signed in, while records made from then on carry the id of the official now using the device.
 */
@Injectable({ providedIn: 'root' })
export class AuthStore {
  private readonly api = inject(AuthApi);
  private readonly router = inject(Router);
  private readonly pins = inject(DevicePins);
  private readonly reachability = inject(ServerReachability);
  private readonly window = inject(DOCUMENT).defaultView;
  private readonly destroyRef = inject(DestroyRef);

  readonly deviceId = deviceId();
  private readonly sessionMe = signal<Me | null>(readKept(sessionKey, meSchema));
  private readonly activeMe = signal<Me | null>(readKept(activeKey, meSchema) ?? this.sessionMe());
  /** An offline switch's PIN, in memory only, so the server session can follow once it is reachable. */
  private handOver: { userId: string; pin: string } | null = null;
  private readonly now = signal(Date.now());
  private readonly ended = signal(false);

  /** The official using this device now, as the server last described them. */
  readonly me = this.activeMe.asReadonly();
  readonly user = computed(() => this.activeMe()?.user ?? null);
  /** Records made on this device carry this id. */
  readonly activeUserId = computed(() => this.user()?.id ?? null);
  readonly roles = computed(() => this.activeMe()?.roles ?? []);
  readonly isSignedIn = computed(() => this.activeMe() !== null);
  /** The official the server's session on this device belongs to. */
  readonly serverUser = computed(() => this.sessionMe()?.user ?? null);
  /** An official took over offline and the server does not know yet. */
  readonly isHandOverPending = computed(() => {
    const server = this.serverUser();
    const active = this.user();
    return server !== null && active !== null && server.id !== active.id;
  });
  readonly sessionExpiresAt = computed(() => {
    const me = this.sessionMe() ?? this.activeMe();
    return me ? new Date(me.sessionExpiresAt) : null;
  });
  readonly expiry = computed<SessionExpiry>(() => {
    const at = this.sessionExpiresAt();
    return at ? describeSessionExpiry(at, new Date(this.now())) : { kind: 'fine' };
  });
  /** The server ended the session (expiry, sign-out elsewhere): the sign-in page says so. */
  readonly sessionHasEnded = this.ended.asReadonly();

  /**
   * Whether the official using the device holds `role`: in that competition (global organisers count
   * everywhere) when one is named, otherwise in any competition.
   */
  can(role: Role, competitionId?: string): boolean {
    if (competitionId !== undefined) return hasRole(this.roles(), competitionId, role);
    return this.roles().some((assignment) => assignment.role === role);
  }

  /** Whether the official using the device holds any role at all in that competition. */
  hasAnyRoleIn(competitionId: string): boolean {
    return hasRole(this.roles(), competitionId, ...allRoles);
  }

  /**
   * Checks with the server now, whenever the browser regains a network and whenever the app comes back
   * to the screen (out of a pocket); moves the expiry clock each minute.
   */
  start(): void {
    void this.refresh();
    const document = this.window?.document;
    const refreshNow = () => void this.refresh();
    const refreshWhenShown = () => {
      if (document?.visibilityState === 'visible') void this.refresh();
    };
    this.window?.addEventListener('online', refreshNow);
    document?.addEventListener('visibilitychange', refreshWhenShown);
    const clock = setInterval(() => this.now.set(Date.now()), 60_000);
    this.destroyRef.onDestroy(() => {
      clearInterval(clock);
      this.window?.removeEventListener('online', refreshNow);
      document?.removeEventListener('visibilitychange', refreshWhenShown);
    });
  }

  /** Asks the server who this device's session belongs to, keeping the cached official when it cannot answer. */
  async refresh(): Promise<void> {
    if (!(await this.settleOwedSignOut())) return;
    let me: Me;
    try {
      me = await this.api.me();
      this.reachability.answered();
    } catch (error) {
      this.reachability.failed(error);
      if (isStatus(error, 401)) this.endSession();
      // Otherwise no connection or a server fault: being offline is not being signed out.
      return;
    }
    this.acceptServerMe(me);
    if (this.handOver && this.isHandOverPending()) await this.completeHandOver(this.handOver);
  }

  async signIn(email: string, password: string): Promise<Me> {
    try {
      const me = await this.api.signIn(email, password, this.deviceId);
      this.reachability.answered();
      this.adoptSession(me);
      return me;
    } catch (error) {
      this.reachability.failed(error);
      throw error;
    }
  }

  /** The server started a session for this official on this device (sign-in or online PIN switch). */
  adoptSession(me: Me): void {
    forget(signOutOwedKey);
    this.handOver = null;
    this.ended.set(false);
    this.setSession(me);
    this.setActive(me);
    this.pins.refreshProfile(me);
  }

  /** An official took over by PIN with no network: they use the device now; the server follows later. */
  useLocally(me: Me, pin: string): void {
    this.setActive(me);
    this.handOver = me.user.id === this.serverUser()?.id ? null : { userId: me.user.id, pin };
  }

  notePinSet(): void {
    const mark = (me: Me | null) => (me ? { ...me, hasPin: true } : null);
    this.setSession(mark(this.sessionMe()));
    this.setActive(mark(this.activeMe()));
  }

  /** Ends this device's session; with no signal the device forgets it now and tells the server later. */
  async signOut(): Promise<void> {
    try {
      await this.api.signOut();
      this.reachability.answered();
    } catch (error) {
      this.reachability.failed(error);
      // A 401 means the server had already ended it; anything else is owed until the server answers.
      if (!isStatus(error, 401)) keep(signOutOwedKey, true);
    }
    this.clearLocal();
  }

  /** Ends every session of the server's official and their PINs on every device; needs the server. */
  async signOutEverywhere(): Promise<void> {
    const userId = this.serverUser()?.id;
    try {
      await this.api.signOutEverywhere();
      this.reachability.answered();
    } catch (error) {
      this.reachability.failed(error);
      throw error;
    }
    if (userId) this.pins.remove(userId);
    this.clearLocal();
  }

  private async settleOwedSignOut(): Promise<boolean> {
    if (!readKept(signOutOwedKey, z.literal(true))) return true;
    try {
      await this.api.signOut();
    } catch (error) {
      this.reachability.failed(error);
      if (isNoConnection(error)) return false;
      // The server answered (most likely 401: the session had ended anyway); nothing more is owed.
    }
    forget(signOutOwedKey);
    return true;
  }

  private acceptServerMe(me: Me): void {
    this.setSession(me);
    this.pins.refreshProfile(me);
    const active = this.activeMe();
    if (active === null || active.user.id === me.user.id) this.setActive(me);
  }

  private async completeHandOver(handOver: { userId: string; pin: string }): Promise<void> {
    try {
      this.adoptSession(await this.api.switchTo(handOver.userId, handOver.pin));
    } catch (error) {
      this.reachability.failed(error);
      // Refused (PIN changed, tries exhausted): the header keeps saying who the server knows.
      if (!isNoConnection(error)) this.handOver = null;
    }
  }

  private endSession(): void {
    const wasSignedIn = this.isSignedIn();
    this.clearLocal();
    if (!wasSignedIn) return;
    this.ended.set(true);
    void this.router.navigate(['/sign-in'], { queryParams: { returnUrl: this.router.url } });
  }

  private clearLocal(): void {
    this.handOver = null;
    this.setSession(null);
    this.setActive(null);
  }

  private setSession(me: Me | null): void {
    this.sessionMe.set(me);
    if (me) keep(sessionKey, me);
    else forget(sessionKey);
  }

  private setActive(me: Me | null): void {
    this.activeMe.set(me);
    if (me) keep(activeKey, me);
    else forget(activeKey);
  }
}
