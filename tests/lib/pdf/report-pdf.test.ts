// @vitest-environment node
import { Buffer } from 'node:buffer';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import sharp from 'sharp';
import { processImage, thumbnailForPdf } from '@/lib/images';
import { renderReportPdf } from '@/lib/pdf/render';
import { callReportSchema } from '@/lib/validations/api';
import { reportFixture } from '../../support/report-fixture';

// The PDF is read back with poppler's pdfinfo, pdftotext and pdffonts (Debian's poppler-utils), a
// PDF reader of its own, so the test checks what any viewer would show, not what we meant to draw.
const poppler = spawnSync('pdftotext', ['-v']).status === 0;
if (!poppler)
  console.warn(
    'report-pdf: poppler-utils (pdftotext, pdfinfo) not installed; the PDF content checks are skipped. apt-get install -y poppler-utils',
  );

const dir = mkdtempSync(path.join(tmpdir(), 'report-pdf-'));
const report = callReportSchema.parse(reportFixture());

function read(pdf: Buffer, name: string) {
  const file = path.join(dir, name);
  writeFileSync(file, new Uint8Array(pdf));
  const text = spawnSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).stdout;
  const info = spawnSync('pdfinfo', [file], { encoding: 'utf8' }).stdout;
  const fonts = spawnSync('pdffonts', [file], { encoding: 'utf8' }).stdout;
  const pages = Number(/^Pages:\s+(\d+)/m.exec(info)?.[1] ?? NaN);
  // pdfimages -list: one line per image drawn on a page, after two header lines.
  const images = spawnSync('pdfimages', ['-list', file], { encoding: 'utf8' })
    .stdout.split('\n')
    .slice(2)
    .filter((l) => l.trim() !== '')
    .map((l) => {
      const [page, , type, width, height, color, , , enc] = l.trim().split(/\s+/);
      return { page: Number(page), type, width: Number(width), height: Number(height), color, enc };
    });
  // Line breaks fall where the page width puts them: compare words, not lines.
  return { text, flat: text.replace(/\s+/g, ' '), pages, fonts, images };
}

describe('the report as PDF', () => {
  it('is a PDF document', async () => {
    const pdf = await renderReportPdf({ report, version: 'customer' });
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(pdf.subarray(-6).toString('latin1')).toMatch(/%%EOF\s*$/);
  });

  it.skipIf(!poppler)(
    'customer copy: one or two pages with the finding, the readings against their bands, the verification and the finding’s caution',
    async () => {
      const { text, flat, pages, fonts } = read(await renderReportPdf({ report, version: 'customer' }), 'customer.pdf');
      expect(pages).toBeGreaterThanOrEqual(1);
      expect(pages).toBeLessThanOrEqual(2);
      expect(text).toContain('Harrow Creek Heating');
      expect(text).toContain('Customer copy');
      expect(text).toContain('Dirty or oxidized flame rod');
      // The readings as entered, with the band each fell in. A flame signal under 1 µA on a two-rod
      // DSI control is too weak to hold the flame, 2 µA or more is good (common practice, no source).
      expect(text).toMatch(/Flame signal \(DC microamps\)\s+0\.6 µA\s+▼ below — Low flame signal/);
      expect(text).toMatch(/after the repair\s+4\.2 µA\s+● within — Good flame signal/);
      expect(text).toMatch(/119\.6 VAC\s+● within — Normal line voltage/);
      expect(text).toContain('Three full heat cycles');
      expect(text).toContain('Have the appliance serviced each year.');
      expect(flat).toContain("This report does not replace local codes, the equipment manufacturer's instructions or licensed practice.");
      // What concerns only the person at the unit stays in the office record.
      expect(text).not.toContain('Lock out the power and verify');
      expect(text).not.toContain('Line voltage inside the cabinet');
      // Fonts embedded from fonts/, subset.
      expect(fonts).toMatch(/DejaVuSans\s.*yes\s+yes/);
      expect(fonts).toMatch(/JetBrainsMono/);
    },
  );

  it.skipIf(!poppler)('office record: every step with its time, the lock-out checklist once, every caution', async () => {
    const { text, pages } = read(await renderReportPdf({ report, version: 'office' }), 'office.pdf');
    expect(pages).toBeGreaterThanOrEqual(1);
    expect(text).toContain('Office record');
    for (const step of report.diagnoses[0].steps) expect(text).toContain(step.stepTitle);
    expect(text.match(/Lock-out: Lock out the power and verify/g)).toHaveLength(2);
    expect(text.match(/Absence of voltage verified at the unit/g)).toHaveLength(1);
    expect(text).toContain('Checklist as above.');
    expect(text).toContain('Line voltage inside the cabinet');
    expect(text).toContain('Rosa Imbert closed the call');
    expect(text).toContain('e.lindqvist@example.test');
  });

  it.skipIf(!poppler)('a long visit still makes a valid PDF whose pages are numbered', async () => {
    const long = structuredClone(report);
    const steps = long.diagnoses[0].steps;
    for (let i = 0; i < 60; i++)
      steps.push({ ...steps[1], id: `${steps[1].id.slice(0, -3)}${String(100 + i)}`, stepTitle: `Repeat reading ${i + 1}` });
    const { text, pages } = read(await renderReportPdf({ report: long, version: 'office' }), 'long.pdf');
    expect(pages).toBeGreaterThan(1);
    expect(text).toContain(`Page ${pages} of ${pages}`);
    expect(text).toContain('Repeat reading 60');
  });

  describe('with photos', () => {
    // A photo as the upload stores it (lib/images.ts re-draws it as WebP, 320 px thumbnail), read
    // back as the PDF needs it: the same path the report takes, minus the object store.
    async function storedPhoto(width: number, height: number, colour: string) {
      const upload = await sharp({ create: { width, height, channels: 3, background: colour } })
        .jpeg()
        .toBuffer();
      const stored = await processImage(upload);
      return thumbnailForPdf(stored.thumb.data);
    }

    it.skipIf(!poppler)('draws each photo’s thumbnail in both versions, under a Photos heading', async () => {
      const photos = [
        { id: 'p1', data: await storedPhoto(1600, 1200, '#8a5a2b'), format: 'jpg' as const },
        { id: 'p2', data: await storedPhoto(900, 1600, '#2b5a8a'), format: 'jpg' as const },
      ];
      for (const version of ['customer', 'office'] as const) {
        const { text, images } = read(await renderReportPdf({ report, version, photos }), `photos-${version}.pdf`);
        expect(text).toMatch(/^\s*Photos\s*$/m);
        // The thumbnails as drawn: JPEG (DCT), the 320 px long side of lib/images.ts's thumbnail, both shapes kept.
        expect(images).toHaveLength(2);
        expect(images.map((i) => i.enc)).toEqual(['jpeg', 'jpeg']);
        expect(images.map((i) => [i.width, i.height])).toEqual([
          [320, 240],
          [180, 320],
        ]);
      }
    });

    it.skipIf(!poppler)('a report without photos has no Photos section and no images', async () => {
      const { text, images } = read(await renderReportPdf({ report, version: 'customer' }), 'no-photos.pdf');
      expect(images).toHaveLength(0);
      expect(text).not.toMatch(/^\s*Photos\s*$/m);
    });
  });
});
