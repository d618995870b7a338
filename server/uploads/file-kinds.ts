import { photoMediaTypes, type PhotoMediaType } from '../../shared/sync/record-kinds';
/** The files devices upload: evidence photos (resized to JPEG on the device) and calibration certificates. */
export const uploadContentTypes = photoMediaTypes;
export type UploadContentType = PhotoMediaType;

const startsWith = (bytes: Buffer, signature: readonly number[], at = 0): boolean =>
  bytes.length >= at + signature.length && signature.every((byte, i) => bytes[at + i] === byte);
const ascii = (text: string): number[] => [...text].map((c) => c.charCodeAt(0));

/**
 * The first bytes every file of each kind starts with. A file must be what it says it is: the server
 * serves it back under that type, and a mislabelled file would be evidence nobody can open.
 */
const signatures: Record<UploadContentType, (bytes: Buffer) => boolean> = {
  'image/jpeg': (bytes) => startsWith(bytes, [0xff, 0xd8, 0xff]),
  'image/png': (bytes) => startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
  'image/webp': (bytes) => startsWith(bytes, ascii('RIFF')) && startsWith(bytes, ascii('WEBP'), 8),
  'application/pdf': (bytes) => startsWith(bytes, ascii('%PDF-')),
};

const labels: Record<UploadContentType, string> = {
  'image/jpeg': 'JPEG photo',
  'image/png': 'PNG picture',
  'image/webp': 'WebP picture',
  'application/pdf': 'PDF document',
};

/** The media type of a Content-Type header without its parameters, or undefined when it is not one we keep. */
export function uploadContentTypeOf(header: string | undefined): UploadContentType | undefined {
  const type = header?.split(';')[0]?.trim().toLowerCase();
  return uploadContentTypes.find((known) => known === type);
}

export function matchesContentType(type: UploadContentType, bytes: Buffer): boolean {
  return signatures[type](bytes);
}

export function labelOf(type: UploadContentType): string {
  return labels[type];
}

/** Photos open in the browser; a PDF is downloaded, so a document never runs inside the app's origin. */
export function contentDispositionOf(type: UploadContentType, sha256: string): string {
  return type === 'application/pdf' ? `attachment; filename="certificate-${sha256.slice(0, 12)}.pdf"` : 'inline';
}
