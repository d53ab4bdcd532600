import sharp, { type Metadata } from 'sharp';
import { AppError } from '@/lib/errors';

// Photos as the server keeps them. An upload is judged by its content (its first bytes), never by
// its name or the type the browser claims; it is decoded and drawn again without any metadata, so
// the EXIF block (with a camera's GPS position) is gone, after the EXIF orientation has been
// applied to the pixels. Two sizes are kept: a display size and a thumbnail, both WebP.

export const MAX_UPLOAD_BYTES = 15 * 1024 * 1024;
/** Longest side and pixel count an upload may have (a 48-megapixel phone camera fits). */
export const MAX_SIDE = 12_000;
export const MAX_PIXELS = 60_000_000;
export const DISPLAY_SIDE = 2048;
export const THUMB_SIDE = 320;

export type ImageType = 'image/jpeg' | 'image/png' | 'image/webp' | 'image/avif' | 'image/heic';

type Bytes = ArrayLike<number>;
const ascii = (buf: Bytes, from: number, to: number) => {
  let text = '';
  for (let i = from; i < Math.min(to, buf.length); i += 1) text += String.fromCharCode(buf[i]);
  return text;
};

/** The image type the bytes start with, or null for anything else. */
export function sniffImageType(buf: Bytes): ImageType | null {
  if (buf.length >= 3 && buf[0] === 0xff && buf[1] === 0xd8 && buf[2] === 0xff) return 'image/jpeg';
  if (
    buf.length >= 8 &&
    buf[0] === 0x89 &&
    ascii(buf, 1, 4) === 'PNG' &&
    buf[4] === 0x0d &&
    buf[5] === 0x0a &&
    buf[6] === 0x1a &&
    buf[7] === 0x0a
  )
    return 'image/png';
  if (buf.length >= 12 && ascii(buf, 0, 4) === 'RIFF' && ascii(buf, 8, 12) === 'WEBP') return 'image/webp';
  // ISO base media (HEIF family): a box of type "ftyp" with the brand at bytes 8-11.
  if (buf.length >= 12 && ascii(buf, 4, 8) === 'ftyp') {
    const brand = ascii(buf, 8, 12);
    if (brand === 'avif' || brand === 'avis') return 'image/avif';
    if (['heic', 'heix', 'hevc', 'hevx', 'heim', 'heis', 'mif1', 'msf1'].includes(brand)) return 'image/heic';
  }
  return null;
}

export interface ProcessedImage {
  type: ImageType;
  display: { data: Buffer; width: number; height: number };
  thumb: { data: Buffer; width: number; height: number };
  original: { size: number; width: number; height: number };
}

const notAnImage = () =>
  new AppError('unsupported_media_type', 'That file is not a photo: send a JPEG, PNG, WebP or AVIF image. Nothing was stored.');

/** Checks and re-draws an uploaded photo; throws an AppError (413, 415, 400) that says what is wrong. */
export async function processImage(input: Buffer): Promise<ProcessedImage> {
  if (input.length > MAX_UPLOAD_BYTES) {
    throw new AppError('payload_too_large', `That photo is too large: at most ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`);
  }
  if (input.length === 0) throw new AppError('bad_request', 'The file is empty. Nothing was stored.');
  const type = sniffImageType(input);
  if (!type) throw notAnImage();
  let meta: Metadata;
  try {
    meta = await sharp(input, { limitInputPixels: false }).metadata();
  } catch {
    if (type === 'image/heic') {
      throw new AppError(
        'unsupported_media_type',
        'HEIC photos cannot be read here. Set the camera to "Most compatible" (JPEG) or pick the photo through the browser, which converts it. Nothing was stored.',
      );
    }
    throw notAnImage();
  }
  const width = meta.width ?? 0;
  const height = meta.height ?? 0;
  if (!width || !height) throw notAnImage();
  if (width > MAX_SIDE || height > MAX_SIDE || width * height > MAX_PIXELS) {
    throw new AppError(
      'payload_too_large',
      `That photo is ${width} × ${height} pixels: at most ${MAX_SIDE} pixels a side and ${MAX_PIXELS / 1_000_000} megapixels.`,
    );
  }
  const draw = async (side: number, quality: number) => {
    try {
      // rotate() with no angle applies the EXIF orientation; the output carries no metadata.
      const { data, info } = await sharp(input, { limitInputPixels: MAX_PIXELS, failOn: 'error' })
        .rotate()
        .resize({ width: side, height: side, fit: 'inside', withoutEnlargement: true })
        .webp({ quality })
        .toBuffer({ resolveWithObject: true });
      return { data, width: info.width, height: info.height };
    } catch {
      throw new AppError('unsupported_media_type', 'That photo is damaged or cut short and cannot be read. Nothing was stored.');
    }
  };
  const display = await draw(DISPLAY_SIDE, 82);
  const thumb = await draw(THUMB_SIDE, 70);
  return { type, display, thumb, original: { size: input.length, width, height } };
}

/**
 * A stored thumbnail (WebP) as JPEG for the PDF: the renderer embeds JPEG and PNG only. Flattened
 * on white, as a page is; at most THUMB_SIDE a side, so a report of many photos stays small.
 */
export async function thumbnailForPdf(stored: Buffer): Promise<Buffer> {
  return sharp(stored, { limitInputPixels: MAX_PIXELS })
    .resize({ width: THUMB_SIDE, height: THUMB_SIDE, fit: 'inside', withoutEnlargement: true })
    .flatten({ background: '#ffffff' })
    .jpeg({ quality: 82 })
    .toBuffer();
}
