import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import { z } from 'zod';
import { meSchema, type Me } from '../../../shared/auth/auth-api';

/** `GET /api/auth/device-users`: officials who set a PIN on this device. */
export const deviceUsersSchema = z.object({
  users: z.array(z.object({ id: z.string(), displayName: z.string() })),
});
export type DeviceUser = z.infer<typeof deviceUsersSchema>['users'][number];

const acceptedInvitationSchema = z.object({ email: z.string() });

/**
 * The sign-in endpoints, each answer checked against the shared schema. Failures reject with the
 * HttpErrorResponse, which `describeLoadError` puts into words.
 */
@Injectable({ providedIn: 'root' })
export class AuthApi {
  private readonly http = inject(HttpClient);

  async signIn(email: string, password: string, deviceId: string): Promise<Me> {
    return meSchema.parse(await firstValueFrom(this.http.post('/api/auth/sign-in', { email, password, deviceId })));
  }

  async me(): Promise<Me> {
    return meSchema.parse(await firstValueFrom(this.http.get('/api/auth/me')));
  }

  async signOut(): Promise<void> {
    await firstValueFrom(this.http.post('/api/auth/sign-out', null));
  }

  async signOutEverywhere(): Promise<void> {
    await firstValueFrom(this.http.post('/api/auth/sign-out-everywhere', null));
  }

  async setPin(password: string, pin: string): Promise<void> {
    await firstValueFrom(this.http.post('/api/auth/pin', { password, pin }));
  }

  async deviceUsers(): Promise<DeviceUser[]> {
    return deviceUsersSchema.parse(await firstValueFrom(this.http.get('/api/auth/device-users'))).users;
  }

  async switchTo(userId: string, pin: string): Promise<Me> {
    return meSchema.parse(await firstValueFrom(this.http.post('/api/auth/switch', { userId, pin })));
  }

  /** Answers the e-mail address the new account signs in with. */
  async acceptInvitation(token: string, password: string): Promise<string> {
    return acceptedInvitationSchema.parse(await firstValueFrom(this.http.post('/api/invitations/accept', { token, password }))).email;
  }

  async requestPasswordReset(email: string): Promise<void> {
    await firstValueFrom(this.http.post('/api/auth/password-reset', { email }));
  }

  async confirmPasswordReset(token: string, password: string): Promise<void> {
    await firstValueFrom(this.http.post('/api/auth/password-reset/confirm', { token, password }));
  }
}
