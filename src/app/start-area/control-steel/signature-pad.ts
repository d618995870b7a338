import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, InjectionToken, afterNextRender, inject, input, output, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import SignaturePad from 'signature_pad';

/** What the field needs of a drawing pad (signature_pad's SignaturePad has all of it). */
export interface DrawingPad {
  isEmpty(): boolean;
  clear(): void;
  /** Draws the strokes again, after the canvas was resized (which wipes it). */
  redraw(): void;
  off(): void;
  toDataURL(type: 'image/png'): string;
  addEventListener(type: 'beginStroke', listener: () => void): void;
}

export type DrawingPadFactory = (canvas: HTMLCanvasElement) => DrawingPad;

/**
 * Makes the pad on the canvas. A spec (jsdom has no 2D canvas) provides its own; the app draws with
 * signature_pad: a thick pen for a finger or a glove, black on white so the PNG reads on any screen.
 */
export const DRAWING_PAD_FACTORY = new InjectionToken<DrawingPadFactory>('drawing pad factory', {
  providedIn: 'root',
  factory: () => (canvas) => new SignaturePad(canvas, { minWidth: 2.5, maxWidth: 6, penColor: 'rgb(0, 0, 0)', backgroundColor: 'rgb(255, 255, 255)' }),
});

/** The bytes of a `data:image/png;base64,...` address as a PNG file. */
export function pngFromDataUrl(dataUrl: string): Blob {
  const prefix = 'data:image/png;base64,';
  if (!dataUrl.startsWith(prefix)) throw new Error('The signature did not come out as a PNG picture.');
  const text = atob(dataUrl.slice(prefix.length));
  const bytes = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) bytes[i] = text.charCodeAt(i);
  return new Blob([bytes], { type: 'image/png' });
}

/**
 * A box to sign in with a finger, with Clear and Sign. Sign hands over the drawing as a PNG, and
 * refuses an empty box in words. The canvas follows its box's size and the screen's pixel ratio, as
 * signature_pad's documentation advises, and keeps the strokes when it is resized.
 */
@Component({
  selector: 'rl-signature-pad',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule],
  templateUrl: './signature-pad.html',
  styleUrl: './signature-pad.scss',
})
export class SignaturePadField {
  /** While the signature is being saved: Sign waits. */
  readonly busy = input(false);
  /** The signature as a PNG file, once Sign is pressed on a box that holds one. */
  readonly signed = output<Blob>();

  protected readonly problem = signal<string | null>(null);
  protected readonly cannotDraw = signal(false);
  private readonly canvas = viewChild.required<ElementRef<HTMLCanvasElement>>('canvas');
  private readonly makePad = inject(DRAWING_PAD_FACTORY);
  private pad: DrawingPad | null = null;

  constructor() {
    let resizes: ResizeObserver | null = null;
    const fit = () => this.fitCanvas();
    afterNextRender(() => {
      const canvas = this.canvas().nativeElement;
      try {
        this.pad = this.makePad(canvas);
      } catch {
        this.cannotDraw.set(true);
        return;
      }
      this.pad.addEventListener('beginStroke', () => this.problem.set(null));
      this.fitCanvas();
      // The box changes size with the window, a turned phone or the layout around it.
      if (typeof ResizeObserver === 'undefined') window.addEventListener('resize', fit);
      else (resizes = new ResizeObserver(fit)).observe(canvas);
    });
    inject(DestroyRef).onDestroy(() => {
      resizes?.disconnect();
      window.removeEventListener('resize', fit);
      this.pad?.off();
    });
  }

  /** Empties the box (after a signature was saved, or when the official starts over). */
  clear(): void {
    this.pad?.clear();
    this.problem.set(null);
  }

  protected sign(): void {
    if (this.busy()) return;
    if (!this.pad) {
      this.cannotDraw.set(true);
      return;
    }
    if (this.pad.isEmpty()) {
      this.problem.set('Write your signature in the white box first: an empty box cannot be signed.');
      return;
    }
    let picture: Blob;
    try {
      picture = pngFromDataUrl(this.pad.toDataURL('image/png'));
    } catch (error) {
      this.problem.set(error instanceof Error ? error.message : 'The signature could not be read. Clear it and sign again.');
      return;
    }
    this.problem.set(null);
    this.signed.emit(picture);
  }

  /** Sizes the canvas's pixels to its box at the screen's pixel ratio (which wipes it), then draws the strokes again. */
  private fitCanvas(): void {
    const canvas = this.canvas().nativeElement;
    // A hidden box has no size: keep what is drawn until it shows again.
    if (!this.pad || canvas.offsetWidth === 0 || canvas.offsetHeight === 0) return;
    // Zoomed out, some browsers report a ratio below 1 and then clear only part of the canvas.
    const ratio = Math.max(window.devicePixelRatio || 1, 1);
    const width = Math.round(canvas.offsetWidth * ratio);
    const height = Math.round(canvas.offsetHeight * ratio);
    if (canvas.width === width && canvas.height === height) return;
    canvas.width = width;
    canvas.height = height;
    canvas.getContext('2d')?.scale(ratio, ratio);
    this.pad.redraw();
  }
}
