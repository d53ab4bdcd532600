// @vitest-environment node
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { AppError } from '@/lib/errors';
import { DISPLAY_SIDE, MAX_UPLOAD_BYTES, processImage, sniffImageType, THUMB_SIDE } from '@/lib/images';

// Photos are judged by their bytes and re-drawn without metadata. The test images are made with
// sharp itself; the byte signatures and EXIF tags checked are those of the published formats.

const solid = (width: number, height: number) => sharp({ create: { width, height, channels: 3, background: '#b5462f' } });

/** The tag numbers of the first IFD of an EXIF block (TIFF layout: byte order, offset of IFD0, 12-byte entries). */
function ifd0Tags(exif: Buffer): number[] {
  const o = exif.toString('latin1', 0, 6) === 'Exif\0\0' ? 6 : 0;
  const le = exif.toString('latin1', o, o + 2) === 'II';
  const u16 = (i: number) => (le ? exif.readUInt16LE(o + i) : exif.readUInt16BE(o + i));
  const u32 = (i: number) => (le ? exif.readUInt32LE(o + i) : exif.readUInt32BE(o + i));
  const ifd = u32(4);
  return Array.from({ length: u16(ifd) }, (_, k) => u16(ifd + 2 + k * 12));
}

// EXIF 2.3 (CIPA DC-008): tag 0x8825 in IFD0 points to the GPS IFD; Orientation 6 means the picture
// must be turned 90° clockwise to be seen upright.
const GPS_IFD_POINTER = 0x8825;

async function refusal(p: Promise<unknown>): Promise<AppError> {
  const error = await p.then(
    () => null,
    (e: unknown) => e,
  );
  expect(error).toBeInstanceOf(AppError);
  return error as AppError;
}

describe('sniffImageType: the type by the first bytes', () => {
  it('knows JPEG, PNG, WebP and AVIF made by sharp', async () => {
    // Signatures: JPEG SOI marker FF D8 FF (ISO/IEC 10918-1); PNG 89 50 4E 47 0D 0A 1A 0A (PNG
    // specification, W3C, §5.2); WebP "RIFF"…"WEBP" (Google's WebP container specification);
    // AVIF an ISO BMFF "ftyp" box with brand "avif" (AV1 Image File Format, AOMedia).
    expect(sniffImageType(await solid(8, 8).jpeg().toBuffer())).toBe('image/jpeg');
    expect(sniffImageType(await solid(8, 8).png().toBuffer())).toBe('image/png');
    expect(sniffImageType(await solid(8, 8).webp().toBuffer())).toBe('image/webp');
    expect(sniffImageType(await solid(8, 8).avif().toBuffer())).toBe('image/avif');
  });

  it('knows the HEIC brand, and nothing in text, PDF or a truncated header', () => {
    const heic = Buffer.from([0, 0, 0, 0x18, ...Buffer.from('ftypheic'), ...new Array<number>(8).fill(0)]);
    expect(sniffImageType(heic)).toBe('image/heic');
    expect(sniffImageType(Buffer.from('Flame rod reading: 4.2 uA\n'))).toBeNull();
    expect(sniffImageType(Buffer.from('%PDF-1.7\n'))).toBeNull();
    expect(sniffImageType(Buffer.from([0xff, 0xd8]))).toBeNull();
    expect(sniffImageType(Buffer.alloc(0))).toBeNull();
  });
});

describe('processImage', () => {
  it('refuses a text file whatever it is called (415), with a message that says what to send', async () => {
    // The name "burner.jpg" never reaches the server's judgement: only the bytes do.
    const e = await refusal(processImage(Buffer.from('this is burner.jpg, honestly')));
    expect(e.code).toBe('unsupported_media_type');
    expect(e.status).toBe(415);
    expect(e.message).toMatch(/not a photo/);
  });

  it('refuses a JPEG cut short after its header (415)', async () => {
    const jpeg = await solid(640, 480).jpeg().toBuffer();
    const e = await refusal(processImage(jpeg.subarray(0, 40)));
    expect(e.status).toBe(415);
  });

  it('refuses an upload over 15 MB (413) before decoding it', async () => {
    const jpeg = await solid(16, 16).jpeg().toBuffer();
    const big = Buffer.concat([jpeg, Buffer.alloc(MAX_UPLOAD_BYTES + 1 - jpeg.length)]);
    expect(big.length).toBe(MAX_UPLOAD_BYTES + 1);
    const e = await refusal(processImage(big));
    expect(e.status).toBe(413);
    expect(e.message).toMatch(/15 MB/);
  });

  it('refuses an image whose dimensions are out of bounds (413)', async () => {
    // A 13000 × 10 PNG is small in bytes but longer than 12000 pixels a side.
    const wide = await solid(13_000, 10).png().toBuffer();
    expect(wide.length).toBeLessThan(MAX_UPLOAD_BYTES);
    const e = await refusal(processImage(wide));
    expect(e.status).toBe(413);
    expect(e.message).toMatch(/13000 × 10/);
  });

  it('strips the EXIF block with the GPS position, and keeps the picture upright', async () => {
    const photo = await solid(400, 200)
      .jpeg()
      .withMetadata({ orientation: 6 })
      .withExif({
        IFD0: { Make: 'TestCam' },
        IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' },
      })
      .toBuffer();
    const before = await sharp(photo).metadata();
    // The input really carries a position and a turn, or the check below could not fail.
    expect(ifd0Tags(before.exif!)).toContain(GPS_IFD_POINTER);
    expect(before.orientation).toBe(6);

    const out = await processImage(photo);
    for (const made of [out.display.data, out.thumb.data]) {
      const meta = await sharp(made).metadata();
      expect(meta.format).toBe('webp');
      expect(meta.exif).toBeUndefined();
      expect(meta.xmp).toBeUndefined();
      expect(meta.orientation ?? 1).toBe(1);
      // Turned by the orientation: a 400 × 200 sensor picture shown upright is 200 wide, 400 high.
      expect(meta.height! > meta.width!).toBe(true);
    }
    expect(out.display).toMatchObject({ width: 200, height: 400 });
    expect(out.original).toMatchObject({ width: 400, height: 200, size: photo.length });
  });

  it('makes a display size and a thumbnail within their bounds, never enlarging', async () => {
    const big = await processImage(await solid(4000, 3000).png().toBuffer());
    expect(big.type).toBe('image/png');
    expect(big.display).toMatchObject({ width: DISPLAY_SIDE, height: 1536 });
    expect(big.thumb).toMatchObject({ width: THUMB_SIDE, height: 240 });
    const small = await processImage(await solid(300, 120).webp().toBuffer());
    expect(small.display).toMatchObject({ width: 300, height: 120 });
    expect(small.thumb).toMatchObject({ width: 300, height: 120 });
  });

  it('refuses an empty file (400)', async () => {
    expect((await refusal(processImage(Buffer.alloc(0)))).status).toBe(400);
  });
});
