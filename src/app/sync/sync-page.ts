import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, ElementRef, computed, effect, inject, signal, viewChild, type WritableSignal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { AuthStore } from '../auth/auth-store';
import { DeviceUsers } from '../auth/device-users';
import { DeviceStore } from '../core/sync/device-store';
import { FileDownload } from '../core/sync/file-download';
import { describeOp, kindHeading } from '../core/sync/record-words';
import { syncedWords } from '../core/sync/status-words';
import { StorageGuard, type Persistence } from '../core/sync/storage-guard';
import { roundWords } from './round-words';

const persistenceWords: Record<Persistence, string> = {
  kept: '✓ The records on this device are kept safe by the browser.',
  'may-clear': '⚠ The browser may clear the records on this device when space is short — sync often.',
  unknown: '⚠ This browser does not say whether it keeps the records — sync often.',
};

/**
 * Everything about this device's records and the server: what waits here (per kind), what the server
 * refused and why, the last error, "Sync now", the backup way out, and the storage state.
 */
@Component({
  selector: 'rl-sync-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, DatePipe],
  templateUrl: './sync-page.html',
  styleUrl: './sync-page.scss',
})
export class SyncPage {
  protected readonly store = inject(DeviceStore);
  protected readonly storage = inject(StorageGuard);
  private readonly auth = inject(AuthStore);
  private readonly deviceUsers = inject(DeviceUsers);
  private readonly download = inject(FileDownload);

  protected readonly status = this.store.status;
  protected readonly busy = signal<'sync' | 'export' | 'import' | null>(null);
  protected readonly syncMessage = signal<string | null>(null);
  protected readonly backupMessage = signal<string | null>(null);
  /** The refusal whose "Put away" asks for confirmation now (op id). */
  protected readonly confirmingPutAway = signal<string | null>(null);
  protected readonly puttingAway = signal<string | null>(null);
  protected readonly putAwayProblem = signal<{ opId: string; message: string } | null>(null);
  protected readonly putAwayMessage = signal<string | null>(null);
  private readonly keepButton = viewChild('keepInList', { read: ElementRef<HTMLButtonElement> });

  protected readonly onlineWords = computed(() => {
    const online = this.status()?.online ?? null;
    if (online === true) return '✓ Online: the server answers.';
    if (online === false) return '✕ Offline: the server does not answer from here. Records stay on this device.';
    return '… Checking whether the server answers.';
  });
  protected readonly waitingWords = computed(() => {
    const pending = this.status()?.pendingCount ?? null;
    if (pending === null) return '…';
    if (pending === 0) return '✓ Nothing waiting: every record made here has reached the server.';
    return `↑ ${pending} ${pending === 1 ? 'record is' : 'records are'} only on this device.`;
  });
  protected readonly lastSync = computed(() => syncedWords(this.status()?.lastSyncAt ?? null, Date.now()));
  protected readonly kinds = computed(() => this.store.outbox().byKind.map((k) => ({ ...k, heading: kindHeading(k.kind) })));
  protected readonly refusals = computed(() =>
    this.store.rejections().map((r) => ({ opId: r.opId, what: describeOp(r.op), reason: r.reason, madeAt: r.op.madeAt, by: this.nameOf(r.op.userId) })),
  );
  protected readonly persistenceText = computed(() => persistenceWords[this.storage.persistence()]);
  protected readonly usageText = computed(() => {
    const numbers = this.storage.estimate();
    const fraction = this.storage.usedFraction();
    if (!numbers || fraction === null) return 'This browser does not say how full its storage is.';
    return `${bytes(numbers.usage)} of ${bytes(numbers.quota)} used (${Math.round(fraction * 100)} %).`;
  });

  constructor() {
    // The "Put away" button gives way to the question; focus goes to the harmless answer.
    effect(() => this.keepButton()?.nativeElement.focus());
  }

  protected askToPutAway(opId: string): void {
    this.putAwayProblem.set(null);
    this.putAwayMessage.set(null);
    this.confirmingPutAway.set(opId);
  }

  protected async putAway(refusal: { opId: string; what: string }): Promise<void> {
    this.puttingAway.set(refusal.opId);
    this.putAwayProblem.set(null);
    try {
      await this.store.dismissRejection(refusal.opId);
      this.confirmingPutAway.set(null);
      this.putAwayMessage.set(`Put away: ${refusal.what}. Its values stay on this device.`);
    } catch (error) {
      this.putAwayProblem.set({ opId: refusal.opId, message: error instanceof Error ? error.message : String(error) });
    } finally {
      this.puttingAway.set(null);
    }
  }

  protected async syncNow(): Promise<void> {
    await this.run('sync', this.syncMessage, async () => roundWords(await this.store.syncNow()));
  }

  protected async exportBackup(): Promise<void> {
    await this.run('export', this.backupMessage, async () => {
      const file = await this.store.exportBackup();
      this.download.save(file.fileName, file.contents);
      if (file.opCount === 0) return `Saved ${file.fileName}. It is empty: nothing on this device waits to be sent.`;
      return `Saved ${file.fileName}: ${file.opCount} ${file.opCount === 1 ? 'change' : 'changes'} of ${file.recordCount} ${file.recordCount === 1 ? 'record' : 'records'}. Keep it until they have reached the server.`;
    });
  }

  protected async importFile(input: HTMLInputElement): Promise<void> {
    const file = input.files?.[0];
    if (!file) return;
    await this.run('import', this.backupMessage, async () => {
      const contents = await file.text();
      // The same file may be chosen again later (importing twice changes nothing).
      input.value = '';
      const imported = await this.store.importBackup(contents);
      const words = `Imported ${file.name}: ${imported.added} ${imported.added === 1 ? 'change' : 'changes'} added, ${imported.alreadyHere} already here.`;
      return `${words} ${roundWords(await this.store.syncNow())}`;
    });
  }

  protected async askToKeep(): Promise<void> {
    await this.storage.askToKeep();
  }

  private async run(what: 'sync' | 'export' | 'import', message: WritableSignal<string | null>, action: () => Promise<string>): Promise<void> {
    this.busy.set(what);
    message.set(null);
    try {
      message.set(await action());
    } catch (error) {
      message.set(error instanceof Error ? error.message : String(error));
    } finally {
      this.busy.set(null);
    }
  }

  private nameOf(userId: string): string {
    const known = [this.auth.user(), this.auth.serverUser(), ...this.deviceUsers.list()].find((user) => user?.id === userId);
    return known?.displayName ?? 'another official';
  }
}

function bytes(count: number): string {
  if (count >= 1e9) return `${(count / 1e9).toFixed(1)} GB`;
  return `${(count / 1e6).toFixed(1)} MB`;
}
