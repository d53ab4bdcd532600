import { spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import type { Locator, Page } from 'playwright-core';
import sharp from 'sharp';
import { freshPage, launchBrowser, setTheme, VIEWPORTS, type Browser } from '@/tests/e2e/support/browser';
import { scrollsSideways } from '@/tests/e2e/support/calls-pages';
import { DEMO, DEMO_PASSWORD, signedIn } from '@/tests/e2e/support/http';
import { useMailSink, type MailSink } from '@/tests/e2e/support/mail';
import { SignInPage } from '@/tests/e2e/support/pages';
import { verifiedVisit, type Visit } from '@/tests/e2e/support/visit';

// In Chromium at tablet size: two photos attached to a reading from the wizard's path so far (one
// sent over a slowed connection, so its progress bar is seen moving), a file that is not a photo
// refused in words and kept listed until let go, the photos on the call page and in the report,
// the report sent, the dev mailbox with the PDF, whose first page is rendered to PNG with
// pdftoppm and whose images are listed with pdfimages. Screenshots go to /tmp/shots-photos/.

const SHOTS = '/tmp/shots-photos';
mkdirSync(SHOTS, { recursive: true });
const shot = (page: Page, name: string) => page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });

const READING = 'Flame signal (DC microamps)';

let browser: Browser;
let sink: MailSink;
let visit: Visit;

beforeAll(async () => {
  sink = await useMailSink();
  browser = await launchBrowser();
  visit = await verifiedVisit(await signedIn(DEMO.technician));
});

afterAll(async () => {
  await browser?.close();
  await sink?.stop();
});

async function signInAs(email: string): Promise<Page> {
  const page = await freshPage(browser);
  await page.setViewportSize(VIEWPORTS['tablet-landscape']);
  await new SignInPage(page).signIn(email, DEMO_PASSWORD);
  return page;
}

/** A photo as a tablet takes one: noise, so that it is large enough (about 2 MB) to see the bar move. */
async function cameraPhoto(colour: string, width = 1600, height = 1200): Promise<Buffer> {
  const noise = await sharp({
    create: { width, height, channels: 3, background: '#808080', noise: { type: 'gaussian', mean: 128, sigma: 60 } },
  })
    .png()
    .toBuffer();
  return sharp(noise)
    .composite([{ input: { create: { width, height, channels: 4, background: colour } }, blend: 'over' }])
    .jpeg({ quality: 95 })
    .toBuffer();
}

/** Waits until the browser has loaded `n` of the images in the locator (a broken one has no natural width; lazy ones load once in view). */
async function loaded(images: Locator, n: number): Promise<number> {
  await images.first().scrollIntoViewIfNeeded();
  const count = () =>
    images.evaluateAll((els) => els.filter((el) => (el as HTMLImageElement).complete && (el as HTMLImageElement).naturalWidth > 0).length);
  const until = Date.now() + 15_000;
  let got = await count();
  while (got < n && Date.now() < until) {
    await new Promise((r) => setTimeout(r, 200));
    got = await count();
  }
  return got;
}

/** Buttons, links and inputs of the locator shorter than a 48 px touch target. */
const small = (where: Locator) =>
  where
    .locator('button:visible, a:visible')
    .evaluateAll((els) => els.filter((el) => el.getBoundingClientRect().height < 47.5).map((el) => el.textContent?.trim()));

describe('photos in the browser', () => {
  it('attaches two photos to a reading, shows them on the call and in the report, and mails the PDF with them', async () => {
    const page = await signInAs(DEMO.technician);
    await page.goto(`/calls/${visit.callId}`);
    await page.getByRole('heading', { level: 1 }).waitFor();
    // The call's Photos section before any photo: the call's own group, empty, with the two ways to add one.
    const callPhotos = page.getByTestId('call-photos');
    await callPhotos.getByText('No photos yet.').first().waitFor();

    await page.getByRole('link', { name: /Open\s*diagnosis 1/ }).click();
    const path = page.getByTestId('path-so-far');
    await path.waitFor();
    await path.locator('summary').click();
    const row = path.locator('ol > li').filter({ hasText: READING }).first();
    await row.getByRole('button', { name: /Add photo/ }).click();
    const control = row.getByTestId('photo-control');
    expect(await small(control)).toEqual([]);
    await shot(page, 'wizard-path-add-photo-tablet');

    // A text file named .jpg: refused by the server in words, kept listed until the user lets it go.
    await control.getByTestId('photo-file-input').setInputFiles({
      name: 'notes.jpg',
      mimeType: 'image/jpeg',
      buffer: Buffer.from('these are my notes, not a photo\n'),
    });
    const refused = control.locator('[data-testid="photo-upload"][data-status="failed"]');
    await refused.waitFor();
    expect(await refused.getByRole('alert').textContent()).toContain('That file is not a photo');
    await shot(page, 'wizard-photo-refused-tablet');
    await refused.getByRole('button', { name: /remove from the list/ }).click();
    await refused.waitFor({ state: 'detached' });

    // Two photos at once, over a slowed upload so that each bar is seen between empty and full.
    const cdp = await page.context().newCDPSession(page);
    await cdp.send('Network.emulateNetworkConditions', {
      offline: false,
      latency: 20,
      downloadThroughput: 10_000_000,
      uploadThroughput: 400_000,
    });
    const [one, two] = await Promise.all([cameraPhoto('#b0602080'), cameraPhoto('#2060b080', 1200, 1600)]);
    await control.getByTestId('photo-file-input').setInputFiles([
      { name: 'rod.jpg', mimeType: 'image/jpeg', buffer: one },
      { name: 'meter.jpg', mimeType: 'image/jpeg', buffer: two },
    ]);
    const bars = control.getByRole('progressbar');
    await bars.first().waitFor();
    expect(await bars.count()).toBe(2);
    await page.waitForFunction(
      () =>
        [...document.querySelectorAll('[role="progressbar"]')].some((b) => {
          const v = Number(b.getAttribute('aria-valuenow'));
          return v > 0 && v < 100;
        }),
      undefined,
      { timeout: 20_000 },
    );
    await shot(page, 'wizard-photo-progress-tablet');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    await control.getByTestId('photo').nth(1).waitFor({ timeout: 60_000 });
    await bars.first().waitFor({ state: 'detached' });
    expect(await control.getByTestId('photo').count()).toBe(2);
    expect(await loaded(control.getByRole('img', { name: /Photo \d of Flame signal/ }), 2)).toBe(2);
    await shot(page, 'wizard-path-photos-tablet');
    for (const size of ['tablet-portrait', 'phone'] as const) {
      await page.setViewportSize(VIEWPORTS[size]);
      expect(await scrollsSideways(page)).toBe(false);
      expect(await small(control)).toEqual([]);
      await shot(page, `wizard-path-photos-${size}`);
    }
    await page.setViewportSize(VIEWPORTS['tablet-landscape']);

    // The finding takes photos too (none here): its section is there with its buttons.
    await page
      .getByTestId('finding-photos')
      .getByRole('button', { name: /Take photo/ })
      .waitFor();

    // The call page: the photos under the reading they were taken of, at the three sizes.
    await page.goto(`/calls/${visit.callId}`);
    const group = callPhotos
      .locator('div')
      .filter({ has: page.getByRole('heading', { name: new RegExp(`^${READING.replace(/[()]/g, '\\$&')}:`) }) });
    await group.first().waitFor();
    expect(await callPhotos.getByRole('heading', { name: 'Photos (2)' }).count()).toBe(1);
    expect(await loaded(group.first().getByRole('img'), 2)).toBe(2);
    for (const [name, size] of Object.entries(VIEWPORTS)) {
      if (name === 'desktop') continue;
      await page.setViewportSize(size);
      await callPhotos.scrollIntoViewIfNeeded();
      expect(await scrollsSideways(page)).toBe(false);
      expect(await small(callPhotos)).toEqual([]);
      await shot(page, `call-photos-${name}`);
    }
    await setTheme(page, 'dark');
    await page.reload();
    await callPhotos.scrollIntoViewIfNeeded();
    await shot(page, 'call-photos-phone-dark');
    await setTheme(page, 'light');
    await page.setViewportSize(VIEWPORTS['tablet-landscape']);
    await page.reload();

    // Removing asks first; cancelling keeps the photo.
    await group
      .first()
      .getByRole('button', { name: /^Remove/ })
      .first()
      .click();
    const dialog = page.getByRole('dialog', { name: 'Remove this photo?' });
    await dialog.waitFor();
    await shot(page, 'call-photo-remove-confirm-tablet');
    await dialog.getByRole('button', { name: 'Cancel' }).click();
    await dialog.waitFor({ state: 'hidden' });
    expect(await group.first().getByTestId('photo').count()).toBe(2);

    // The report, customer copy and office record: both photos, loaded.
    for (const version of ['customer', 'office']) {
      await page.goto(`/calls/${visit.callId}/report${version === 'customer' ? '?version=customer' : ''}`);
      const photos = page.locator('section[aria-labelledby="r-photos"]');
      await photos.waitFor();
      expect(await loaded(photos.getByRole('img'), 2)).toBe(2);
      await shot(page, `report-${version}-photos-tablet`);
    }

    // Send the customer copy; the call page shows the e-mail as sent.
    await page.goto(`/calls/${visit.callId}/report?version=customer`);
    await page.getByRole('button', { name: 'Preview the e-mail' }).click();
    const form = page.getByRole('form', { name: 'E-mail preview' });
    await form.getByRole('button', { name: 'Send the report' }).click();
    await page.getByText(/Queued for .*\. It is sent in a moment/).waitFor();
    await page.goto(`/calls/${visit.callId}`);
    const email = page.getByTestId('call-email-status');
    await email
      .locator('li[data-status="sent"]')
      .first()
      .waitFor({ timeout: 45_000 })
      .catch(async () => {
        // The status list refreshes itself while a message waits; a reload shows a send that landed meanwhile.
        await page.reload();
        await email.locator('li[data-status="sent"]').first().waitFor({ timeout: 30_000 });
      });
    expect(await email.getByRole('button', { name: /Resend/ }).count()).toBe(1);
    await email.scrollIntoViewIfNeeded();
    await shot(page, 'call-email-sent-tablet');
    // The office record from the PDF route (the route's own rendering, not the mailed one).
    const office = await page.request.get(`/api/calls/${visit.callId}/report.pdf?version=office`);
    expect(office.status()).toBe(200);
    writeFileSync(`${SHOTS}/office-report.pdf`, new Uint8Array(await office.body()));
    await page.close();

    if (!sink.dir) {
      console.warn('MAIL_SINK_DIR is not set: the dev mailbox is not checked.');
      return;
    }
    const adminPage = await signInAs(DEMO.admin);
    await adminPage.goto('/admin/mailbox');
    await adminPage.getByRole('heading', { name: 'Dev mailbox', level: 1 }).waitFor();
    const item = adminPage.locator('details').filter({ hasText: visit.siteName }).first();
    await item.locator('summary').click();
    const attachment = item.getByRole('link', { name: /service-report-.*\.pdf \(application\/pdf/ });
    await attachment.waitFor();
    await shot(adminPage, 'dev-mailbox-tablet');
    const res = await adminPage.request.get((await attachment.getAttribute('href'))!);
    expect(res.status()).toBe(200);
    const pdf = await res.body();
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    writeFileSync(`${SHOTS}/mailed-report.pdf`, new Uint8Array(pdf));
    await adminPage.close();

    if (spawnSync('pdfimages', ['-v']).error) {
      console.warn('poppler-utils is not installed: the PDF images are not listed nor its page rendered.');
      return;
    }
    // Two images in each, the thumbnails (320 px on the long side, lib/images.ts), one landscape, one portrait.
    for (const file of ['mailed-report.pdf', 'office-report.pdf']) {
      const images = spawnSync('pdfimages', ['-list', `${SHOTS}/${file}`], { encoding: 'utf8' })
        .stdout.split('\n')
        .slice(2)
        .filter((l) => l.trim())
        .map((l) => l.trim().split(/\s+/))
        .map(([, , , w, h, , , , enc]) => ({ w: Number(w), h: Number(h), enc }))
        // Sent at the same time, the two land in either order.
        .sort((a, b) => b.w - a.w);
      expect(images).toEqual([
        { w: 320, h: 240, enc: 'jpeg' },
        { w: 240, h: 320, enc: 'jpeg' },
      ]);
    }
    const render = spawnSync('pdftoppm', ['-png', '-r', '80', `${SHOTS}/mailed-report.pdf`, `${SHOTS}/mailed-report-page`]);
    expect(render.status).toBe(0);
  }, 240_000);
});
