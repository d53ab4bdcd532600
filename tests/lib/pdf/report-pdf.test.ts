// @vitest-environment node
import { Buffer } from 'node:buffer';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
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
  // Line breaks fall where the page width puts them: compare words, not lines.
  return { text, flat: text.replace(/\s+/g, ' '), pages, fonts };
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
});
