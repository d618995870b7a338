import type { PhotoFileInput } from '../device-store/record-writer';
import { RecordRefusedError } from '../device-store/store-errors';
import { fitWithin, photoJpegQuality } from './photo-size';

/**
 * Makes a file ready to keep on the device: a picture is decoded, turned upright, scaled to 1600 px on
 * its long edge and saved again as JPEG (which also drops its location data); a PDF certificate is kept
 * as it is. Runs in the browser (createImageBitmap and a canvas).
 */
export async function preparePhoto(file: Blob): Promise<PhotoFileInput> {
  if (file.type === 'application/pdf') {
    return { mediaType: 'application/pdf', data: await file.arrayBuffer(), width: null, height: null };
  }
  let bitmap: ImageBitmap;
  try {
    bitmap = await createImageBitmap(file, { imageOrientation: 'from-image' });
  } catch {
    throw new RecordRefusedError('This file is not a photo this device can open. Take the photo again, or choose a JPEG or PNG.');
  }
  try {
    const size = fitWithin(bitmap.width, bitmap.height);
    const jpeg = await drawAsJpeg(bitmap, size.width, size.height);
    return { mediaType: 'image/jpeg', data: await jpeg.arrayBuffer(), ...size };
  } finally {
    bitmap.close();
  }
}

async function drawAsJpeg(bitmap: ImageBitmap, width: number, height: number): Promise<Blob> {
  if (typeof OffscreenCanvas !== 'undefined') {
    const canvas = new OffscreenCanvas(width, height);
    draw(canvas.getContext('2d'), bitmap, width, height);
    return canvas.convertToBlob({ type: 'image/jpeg', quality: photoJpegQuality });
  }
  const canvas = document.createElement('canvas');
  canvas.width = width;
  canvas.height = height;
  draw(canvas.getContext('2d'), bitmap, width, height);
  return new Promise((resolve, reject) =>
    canvas.toBlob((blob) => (blob ? resolve(blob) : reject(new RecordRefusedError('This device could not save the photo. Try again.'))), 'image/jpeg', photoJpegQuality),
  );
}

function draw(context: OffscreenCanvasRenderingContext2D | CanvasRenderingContext2D | null, bitmap: ImageBitmap, width: number, height: number): void {
  if (!context) throw new RecordRefusedError('This device could not save the photo (no drawing surface). Try again.');
  context.drawImage(bitmap, 0, 0, width, height);
}

// The PNG signature, then its first chunk, IHDR (length 13), whose first 8 bytes are the width and height.
const pngStart = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52];
const pdfSignature = [0x25, 0x50, 0x44, 0x46, 0x2d]; // "%PDF-"

/**
 * Makes a PNG or PDF ready to keep exactly as it is (a signature, a scanned certificate): no scaling and
 * no re-encoding, so its bytes and fingerprint stay those of the file given. A PNG's size in pixels is
 * read from its header; no canvas is needed.
 */
export async function keepFileAsIs(file: Blob): Promise<PhotoFileInput> {
  const data = await file.arrayBuffer();
  const bytes = new Uint8Array(data);
  const startsWith = (signature: readonly number[]) => signature.every((byte, i) => bytes[i] === byte);
  if (file.type === 'application/pdf' && startsWith(pdfSignature)) {
    return { mediaType: 'application/pdf', data, width: null, height: null };
  }
  if (file.type === 'image/png' && startsWith(pngStart) && bytes.byteLength >= 24) {
    const header = new DataView(data, 16, 8);
    const width = header.getUint32(0);
    const height = header.getUint32(4);
    if (width > 0 && height > 0) return { mediaType: 'image/png', data, width, height };
  }
  throw new RecordRefusedError('Only a PNG picture or a PDF is kept exactly as it is, and this file is neither.');
}
