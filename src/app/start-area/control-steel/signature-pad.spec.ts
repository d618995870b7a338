import type { Provider } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { appTestProviders, blankRoutes } from '../../testing/app-test-providers';
import { pngFromDataUrl, SignaturePadField } from './signature-pad';
import { fakeDrawingPads, signaturePngBytes, signaturePngDataUrl } from './testing/fake-drawing-pad';

async function openField(providers: Provider[] = []) {
  TestBed.configureTestingModule({ providers: [...appTestProviders(blankRoutes('')), ...providers] });
  const fixture = TestBed.createComponent(SignaturePadField);
  const signed: Blob[] = [];
  fixture.componentInstance.signed.subscribe((picture) => signed.push(picture));
  await fixture.whenStable();
  const element = fixture.nativeElement as HTMLElement;
  const text = (selector: string) => {
    fixture.detectChanges();
    return element.querySelector(selector)?.textContent?.replace(/\s+/g, ' ').trim() ?? '';
  };
  const press = (label: string) => {
    const button = [...element.querySelectorAll('button')].find((b) => b.textContent?.trim() === label);
    if (!button) throw new Error(`No button "${label}"`);
    button.click();
    fixture.detectChanges();
  };
  return { fixture, element, signed, text, press };
}

const bytesOf = async (blob: Blob) => new Uint8Array(await blob.arrayBuffer());

/** A finger stroke across the canvas, as the browser reports it (pointer events where there are any). */
function stroke(canvas: HTMLCanvasElement): void {
  const pointer = typeof PointerEvent !== 'undefined';
  const event = (type: 'down' | 'move' | 'up', x: number, y: number, buttons: number) =>
    pointer
      ? new PointerEvent(`pointer${type}`, { clientX: x, clientY: y, buttons, pointerId: 1, bubbles: true, cancelable: true })
      : new MouseEvent(`mouse${type}`, { clientX: x, clientY: y, buttons, bubbles: true, cancelable: true });
  canvas.dispatchEvent(event('down', 10, 10, 1));
  window.dispatchEvent(event('move', 60, 40, 1));
  window.dispatchEvent(event('move', 120, 20, 1));
  window.dispatchEvent(event('up', 120, 20, 0));
}

describe('SignaturePadField', () => {
  afterEach(() => vi.restoreAllMocks());

  it('when the box is empty, then Sign is refused in words and hands over nothing; a stroke takes the words away', async () => {
    const { pads, providers } = fakeDrawingPads();
    const field = await openField(providers);

    field.press('Sign');

    expect(field.text('[data-section="signature-problem"]')).toBe('⚠ Write your signature in the white box first: an empty box cannot be signed.');
    expect(field.element.querySelector('[data-section="signature-problem"]')?.getAttribute('role')).toBe('alert');
    expect(field.signed).toEqual([]);

    pads[0]!.draw();
    expect(field.text('[data-section="signature-problem"]')).toBe('');
  });

  it('when a signature is drawn and Sign is pressed, then it is handed over as the PNG the pad made, byte for byte', async () => {
    const { pads, providers } = fakeDrawingPads();
    const field = await openField(providers);

    pads[0]!.draw();
    field.press('Sign');

    expect(field.signed).toHaveLength(1);
    expect(field.signed[0]!.type).toBe('image/png');
    expect(await bytesOf(field.signed[0]!)).toEqual(signaturePngBytes());
  });

  it('when Clear is pressed, then the drawing is gone and Sign is refused again', async () => {
    const { pads, providers } = fakeDrawingPads();
    const field = await openField(providers);
    pads[0]!.draw();

    field.press('Clear');
    field.press('Sign');

    expect(pads[0]!.isEmpty()).toBe(true);
    expect(field.signed).toEqual([]);
    expect(field.text('[data-section="signature-problem"]')).toContain('an empty box cannot be signed');
  });

  it('when the signature is being saved, then Sign waits and hands over nothing more', async () => {
    const { pads, providers } = fakeDrawingPads();
    const field = await openField(providers);
    field.fixture.componentRef.setInput('busy', true);
    pads[0]!.draw();

    const sign = [...field.element.querySelectorAll('button')].find((b) => b.textContent?.trim() === 'Sign')!;
    field.fixture.detectChanges();
    expect(sign.disabled).toBe(true);
    sign.click();
    expect(field.signed).toEqual([]);
  });

  it('when the box leaves the screen, then the pad stops listening to the finger', async () => {
    const { pads, providers } = fakeDrawingPads();
    const field = await openField(providers);
    field.fixture.destroy();
    expect(pads[0]!.isOff).toBe(true);
  });

  it('with signature_pad itself on a stand-in 2D context, then a finger stroke makes the box not empty and Sign hands over the canvas PNG', async () => {
    // jsdom has no 2D canvas: every drawing call is accepted and does nothing; the PNG is a fixed one.
    const context = new Proxy({} as Record<string | symbol, unknown>, {
      get: (target, key) => (key in target ? target[key] : () => undefined),
      set: (target, key, value) => {
        target[key] = value;
        return true;
      },
    });
    vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(context as never);
    const toDataURL = vi.spyOn(HTMLCanvasElement.prototype, 'toDataURL').mockReturnValue(signaturePngDataUrl);
    const field = await openField();
    const canvas = field.element.querySelector('canvas')!;

    field.press('Sign');
    expect(field.text('[data-section="signature-problem"]')).toContain('an empty box cannot be signed');

    stroke(canvas);
    field.press('Sign');

    expect(field.text('[data-section="signature-problem"]')).toBe('');
    expect(toDataURL).toHaveBeenCalledWith('image/png', undefined);
    expect(field.signed).toHaveLength(1);
    expect(await bytesOf(field.signed[0]!)).toEqual(signaturePngBytes());
    // signature_pad keeps the page from scrolling under the finger.
    expect(canvas.style.touchAction).toBe('none');
  });

  it('when this browser cannot draw on a canvas, then it says so in words and Sign hands over nothing', async () => {
    vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockReturnValue(null);
    const field = await openField();

    expect(field.text('[data-section="cannot-draw"]')).toContain('This device cannot draw a signature here, so the log cannot be signed on it.');
    field.press('Sign');
    expect(field.signed).toEqual([]);
  });
});

describe('pngFromDataUrl', () => {
  it('when given a PNG data address, then the file holds its bytes; anything else is refused', async () => {
    const png = pngFromDataUrl(signaturePngDataUrl);
    expect(png.type).toBe('image/png');
    expect(await bytesOf(png)).toEqual(signaturePngBytes());
    expect(() => pngFromDataUrl('data:image/jpeg;base64,/9j/4AAQ')).toThrow('The signature did not come out as a PNG picture.');
  });
});
