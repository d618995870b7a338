import {
  type ApplicationConfig,
  inject,
  isDevMode,
  provideAppInitializer,
  provideBrowserGlobalErrorListeners,
  provideZonelessChangeDetection,
} from '@angular/core';
import { provideHttpClient, withFetch, withInterceptors } from '@angular/common/http';
import { provideRouter, withComponentInputBinding } from '@angular/router';
import { provideServiceWorker } from '@angular/service-worker';
import { bypassServiceWorkerForApi } from './core/api-bypass';
import { routes } from './app.routes';
import { AuthStore } from './auth/auth-store';
import { FieldDataStore } from './core/field-data/field-data-store';
import { AppUpdate } from './core/sync/app-update';
import { DeviceStore } from './core/sync/device-store';

export const appConfig: ApplicationConfig = {
  providers: [
    provideBrowserGlobalErrorListeners(),
    provideZonelessChangeDetection(),
    provideRouter(routes, withComponentInputBinding()),
    provideHttpClient(withFetch(), withInterceptors([bypassServiceWorkerForApi])),
    // Starts from the cached official at once and asks the server in the background: never waits for a network.
    provideAppInitializer(() => inject(AuthStore).start()),
    // Opens the records on this device in the background; syncing follows sign-in.
    provideAppInitializer(() => inject(DeviceStore).start()),
    provideAppInitializer(() => inject(AppUpdate).start()),
    // Keeps each competition's start list, instruments and rules on the device after every sync.
    provideAppInitializer(() => inject(FieldDataStore).start()),
    provideServiceWorker('ngsw-worker.js', {
      enabled: !isDevMode(),
      registrationStrategy: 'registerWhenStable:30000',
    }),
  ],
};
