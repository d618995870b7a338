import type { Provider } from '@angular/core';
import { DRAWING_PAD_FACTORY, type DrawingPad } from '../signature-pad';

/** A real 3 × 2 px white PNG, as a data address: what the fake pad "draws". */
export const signaturePngDataUrl =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAMAAAACCAIAAAASFvFNAAAADklEQVR4nGP4DwMMcBYAs2AR7za3GVIAAAAASUVORK5CYII=';

/** The bytes of that PNG. */
export const signaturePngBytes = () => Uint8Array.from(atob(signaturePngDataUrl.split(',')[1]!), (c) => c.charCodeAt(0));

/**
 * Stands in for signature_pad in specs (jsdom has no 2D canvas): a spec draws a stroke with `draw()`, and
 * the pad reports strokes, emptiness and its PNG as signature_pad does.
 */
export class FakeDrawingPad implements DrawingPad {
  strokes = 0;
  isOff = false;
  private readonly onStroke: (() => void)[] = [];

  constructor(readonly canvas: HTMLCanvasElement) {}

  draw(): void {
    for (const listener of this.onStroke) listener();
    this.strokes++;
  }
  isEmpty(): boolean {
    return this.strokes === 0;
  }
  clear(): void {
    this.strokes = 0;
  }
  redraw(): void {}
  off(): void {
    this.isOff = true;
  }
  toDataURL(): string {
    return signaturePngDataUrl;
  }
  addEventListener(_type: 'beginStroke', listener: () => void): void {
    this.onStroke.push(listener);
  }
}

/** Providers that make every signature box use a fake pad; `pads` holds them in the order they were made. */
export function fakeDrawingPads(): { pads: FakeDrawingPad[]; providers: Provider[] } {
  const pads: FakeDrawingPad[] = [];
  const factory = (canvas: HTMLCanvasElement) => {
    const pad = new FakeDrawingPad(canvas);
    pads.push(pad);
    return pad;
  };
  return { pads, providers: [{ provide: DRAWING_PAD_FACTORY, useValue: factory }] };
}
