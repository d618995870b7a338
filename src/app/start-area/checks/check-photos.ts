import { ChangeDetectionStrategy, Component, DestroyRef, computed, effect, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { switchMap } from 'rxjs';
import { DeviceStore } from '../../core/sync/device-store';

interface ShownPhoto {
  id: string;
  sha256: string;
  mediaType: string;
  takenAt: string;
  caption: string;
  onlyHere: boolean;
}

/**
 * Evidence photos of one record (a check, a violation): taken with the device camera (or chosen from its
 * files), scaled and saved on this device at once, uploaded after that record has reached the server.
 */
@Component({
  selector: 'rl-check-photos',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  template: `
    <section class="stack" [attr.aria-labelledby]="'photos-title-' + of()">
      <h2 [id]="'photos-title-' + of()">{{ heading() }}</h2>
      <div class="actions">
        <button mat-stroked-button type="button" (click)="camera.click()" [disabled]="busy()">
          {{ busy() ? 'Saving the photo…' : addLabel() }}
        </button>
        <input #camera type="file" name="photo" accept="image/*" capture="environment" hidden (change)="add(camera)" />
      </div>
      @if (saved(); as text) {
        <p class="saved" role="status">✓ {{ text }}</p>
      }
      @if (problem(); as text) {
        <p class="problem" role="alert"><strong>⚠ Photo not saved.</strong> {{ text }}</p>
      }
      @if (photos().length === 0) {
        <p>No photos.</p>
      } @else {
        <ul class="photos">
          @for (photo of photos(); track photo.id) {
            <li>
              <figure>
                <img [src]="urls()[photo.sha256] ?? ''" [alt]="'Photo ' + ($index + 1) + ' of ' + subject()" />
                <figcaption>{{ photo.takenAt.slice(11, 16) }}{{ photo.onlyHere ? ' · only on this device' : '' }}</figcaption>
              </figure>
            </li>
          }
        </ul>
      }
    </section>
  `,
  styleUrl: './start-checks.scss',
})
export class CheckPhotos {
  private readonly store = inject(DeviceStore);
  readonly competitionId = input.required<string>();
  /** The record the photos show. */
  readonly of = input.required<string>();
  readonly heading = input('Photos');
  readonly addLabel = input('📷 Take a photo');
  /** What the photos show, for their alternative text: "this check", "the violation". */
  readonly subject = input('this check');

  private readonly records = toSignal(toObservable(this.competitionId).pipe(switchMap((id) => this.store.watchRecords(id, 'photo'))), { initialValue: [] });
  readonly photos = computed<ShownPhoto[]>(() =>
    this.records()
      .filter((r) => r.fields['of'] === this.of())
      .map((r) => ({
        id: r.id,
        sha256: String(r.fields['sha256']),
        mediaType: String(r.fields['mediaType']),
        takenAt: String(r.fields['takenAt']),
        caption: String(r.fields['caption'] ?? ''),
        onlyHere: r.version === null,
      }))
      .sort((a, b) => a.takenAt.localeCompare(b.takenAt)),
  );
  /** sha256 → address to show it from; blob: addresses are revoked when the screen closes. */
  readonly urls = signal<Partial<Record<string, string>>>({});
  readonly busy = signal(false);
  readonly saved = signal<string | null>(null);
  readonly problem = signal<string | null>(null);

  constructor() {
    const asked = new Set<string>();
    effect(() => {
      for (const photo of this.photos()) {
        if (asked.has(photo.sha256)) continue;
        asked.add(photo.sha256);
        void this.store.photoUrl(photo.sha256, photo.mediaType).then((url) => this.urls.update((urls) => ({ ...urls, [photo.sha256]: url })));
      }
    });
    inject(DestroyRef).onDestroy(() => {
      for (const url of Object.values(this.urls())) if (url?.startsWith('blob:')) URL.revokeObjectURL(url);
    });
  }

  async add(picker: HTMLInputElement): Promise<void> {
    const file = picker.files?.[0];
    picker.value = '';
    if (!file) return;
    this.busy.set(true);
    this.saved.set(null);
    this.problem.set(null);
    try {
      await this.store.attachPhoto(this.of(), file, 'evidence');
      this.saved.set('Photo saved on this device');
    } catch (error) {
      this.problem.set(error instanceof Error ? error.message : String(error));
    } finally {
      this.busy.set(false);
    }
  }
}
