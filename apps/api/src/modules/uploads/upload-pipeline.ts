import { fileTypeFromBuffer } from 'file-type';
import sharp from 'sharp';
import { HttpError } from '../../lib/http-error';

/** Photo media types Tappet accepts (what the content says, never the name or declared type). */
export const acceptedPhotoTypes = ['image/jpeg', 'image/png', 'image/webp'] as const;
/** Document media types Tappet accepts. */
export const acceptedDocumentTypes = ['application/pdf'] as const;

/** Longest side a stored photo keeps; larger photos are scaled down. */
export const maxPhotoSide = 3200;
/** Longest side of a thumbnail. */
export const thumbnailSide = 480;
/** Largest image (in pixels) sharp will decode: refuses decompression bombs. */
export const maxInputPixels = 80_000_000;

/** An upload that passed the checks, ready to store. */
export type PreparedUpload =
  | { kind: 'photo'; mediaType: 'image/jpeg'; extension: 'jpg'; data: Buffer; thumbnail: Buffer; width: number; height: number; originalName: string }
  | { kind: 'document'; mediaType: 'application/pdf'; extension: 'pdf'; data: Buffer; thumbnail: null; width: null; height: null; originalName: string };

/** A file the upload refuses; the message names the file and what to do. */
export class UploadRejected extends HttpError {
  constructor(status: 400 | 413 | 415, message: string) {
    super(status, status === 413 ? 'payload_too_large' : status === 415 ? 'unsupported_media_type' : 'bad_request', message);
  }
}

/**
 * A file name fit for showing and for a Content-Disposition header: the last path segment, control
 * characters and quotes removed, at most 120 characters. Never used to build a storage path.
 */
export function displayName(original: string): string {
  const last = original.split(/[\\/]/).pop() ?? '';
  // eslint-disable-next-line no-control-regex
  const cleaned = last.replace(/[\u0000-\u001f\u007f"<>]/g, '').trim();
  return (cleaned || 'upload').slice(0, 120);
}

/**
 * Checks one uploaded file by its content and prepares what is stored:
 * - the type is sniffed from the bytes (file-type): JPEG, PNG and WebP photos and PDF documents
 *   only, whatever the extension or the declared type;
 * - photos are decoded and re-encoded as JPEG by sharp, turned upright from their EXIF orientation
 *   first (`rotate()`), which drops every metadata block (EXIF with GPS location, XMP, IPTC), and
 *   get a thumbnail;
 * - PDFs are kept byte for byte (they are served as downloads, never rendered by the app).
 * Throws {@link UploadRejected} with a message for people.
 */
export async function prepareUpload(file: { buffer: Buffer; originalname: string }): Promise<PreparedUpload> {
  const name = displayName(file.originalname);
  if (file.buffer.length === 0) throw new UploadRejected(400, `“${name}” is empty. Choose the file again.`);
  const sniffed = await fileTypeFromBuffer(file.buffer);
  if (sniffed?.mime === 'application/pdf') {
    return { kind: 'document', mediaType: 'application/pdf', extension: 'pdf', data: file.buffer, thumbnail: null, width: null, height: null, originalName: name };
  }
  if (!sniffed || !(acceptedPhotoTypes as readonly string[]).includes(sniffed.mime)) {
    throw new UploadRejected(415, `“${name}” is not a photo or a PDF${sniffed ? ` (its content is ${sniffed.mime})` : ''}. Upload JPEG, PNG or WebP photos and PDF documents.`);
  }
  try {
    const source = () => sharp(file.buffer, { limitInputPixels: maxInputPixels, failOn: 'error' });
    // No withMetadata(): sharp writes none of the input's EXIF, XMP or IPTC into the output.
    const photo = await source()
      .rotate()
      .resize({ width: maxPhotoSide, height: maxPhotoSide, fit: 'inside', withoutEnlargement: true })
      .flatten({ background: '#ffffff' })
      .jpeg({ quality: 85 })
      .toBuffer({ resolveWithObject: true });
    const thumbnail = await sharp(photo.data).resize({ width: thumbnailSide, height: thumbnailSide, fit: 'inside', withoutEnlargement: true }).jpeg({ quality: 75 }).toBuffer();
    return { kind: 'photo', mediaType: 'image/jpeg', extension: 'jpg', data: photo.data, thumbnail, width: photo.info.width, height: photo.info.height, originalName: name };
  } catch (err) {
    if (err instanceof HttpError) throw err;
    throw new UploadRejected(400, `“${name}” looks like an image but could not be read (it may be damaged or too large in pixels). Try exporting it again as JPEG.`);
  }
}
