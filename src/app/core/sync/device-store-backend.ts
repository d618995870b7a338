import { InjectionToken } from '@angular/core';
import type { DeviceDb } from '../device-store/device-db';
import { createHttpTransport } from '../device-store/http-transport';
import type { SyncEngineOptions } from '../device-store/sync-engine';
import type { SyncTransport } from '../device-store/sync-transport';
import type { UploadTransport } from '../device-store/upload-photos';

/** Where DeviceStore keeps records and how it reaches the server; specs give fake-indexeddb and a fake server. */
export interface DeviceStoreBackend {
  openDb(deviceId: string, onVersionChange: () => void): Promise<DeviceDb>;
  transport: SyncTransport;
  /** Where photo files go; specs without it keep photos waiting on the device. */
  uploads?: UploadTransport;
  now: () => number;
  /** Engine settings other than the database, transport and clock (e.g. the interval between rounds). */
  engine?: Omit<Partial<SyncEngineOptions>, 'db' | 'transport' | 'now'>;
}

export const DEVICE_STORE_BACKEND = new InjectionToken<DeviceStoreBackend>('DeviceStoreBackend', {
  providedIn: 'root',
  factory: () => {
    // Same origin: the browser sends the session cookie and the Origin header by itself.
    const http = createHttpTransport();
    return {
      // Dexie loads with the database, not with the first screen.
      openDb: async (deviceId, onVersionChange) => (await import('../device-store/device-db')).openDeviceDb({ deviceId, onVersionChange }),
      transport: http,
      uploads: http,
      now: () => Date.now(),
    };
  },
});
