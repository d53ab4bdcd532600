import { spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { freshPage, launchBrowser, VIEWPORTS, type Browser } from '@/tests/e2e/support/browser';
import { DEMO, DEMO_PASSWORD, signedIn } from '@/tests/e2e/support/http';
import { useMailSink, type MailSink } from '@/tests/e2e/support/mail';
import { SignInPage } from '@/tests/e2e/support/pages';
import { verifiedVisit, type Visit } from '@/tests/e2e/support/visit';

// In Chromium at tablet size: the report's customer copy, the e-mail preview, the send, its status
// on the call's report page, and the message in the dev mailbox with the PDF attached, whose first
// page is rendered to PNG with pdftoppm. Screenshots go to /tmp/shots-h10b/.

const SHOTS = '/tmp/shots-h10b';
mkdirSync(SHOTS, { recursive: true });
const shot = (page: Page, name: string) => page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });

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

describe('report by e-mail in the browser', () => {
  it('previews, sends, shows the status, and the dev mailbox has it with the PDF', async () => {
    const page = await signInAs(DEMO.technician);
    await page.goto(`/calls/${visit.callId}/report?version=customer`);
    await page.getByRole('heading', { name: 'Service report', level: 1 }).waitFor();
    const article = page.getByRole('article');
    expect(await article.textContent()).toContain(visit.findingTitle);
    await shot(page, 'report-customer-tablet');

    await page.getByRole('button', { name: 'Preview the e-mail' }).click();
    const form = page.getByRole('form', { name: 'E-mail preview' });
    await form.waitFor();
    expect(await form.getByRole('textbox', { name: 'Recipient 1' }).inputValue()).toBe(visit.customerEmail);
    expect(await form.getByRole('textbox', { name: 'Recipient 2' }).inputValue()).toBe('office@kestrel-valley.demo.test');
    expect(await form.getByRole('textbox', { name: 'Subject' }).inputValue()).toContain(visit.siteName);
    expect(await form.getByRole('link', { name: /service-report-.*\.pdf/ }).count()).toBe(1);
    // Touch targets of the form: at least 48 px tall.
    const small = await form
      .locator('button, input, a')
      .evaluateAll((els) => els.filter((el) => el.getBoundingClientRect().height < 47.5).length);
    expect(small).toBe(0);
    await shot(page, 'report-email-preview-tablet');

    // A bad address is refused in words before anything is sent.
    await form.getByRole('textbox', { name: 'Recipient 2' }).fill('office at kestrel');
    await form.getByRole('button', { name: 'Send the report' }).click();
    await page.getByText('That is not a valid e-mail address.').first().waitFor();
    await form.getByRole('textbox', { name: 'Recipient 2' }).fill('office@kestrel-valley.demo.test');

    await form.getByRole('button', { name: 'Send the report' }).dblclick();
    await page.getByText(/Queued for .*\. It is sent in a moment/).waitFor();
    const list = page.getByRole('list', { name: 'E-mails from this call' });
    await list.locator('li[data-status="sent"]').first().waitFor({ timeout: 45_000 });
    // One message for the double tap.
    expect(await list.locator('li').count()).toBe(1);
    await shot(page, 'report-email-sent-tablet');
    await page.close();

    if (!sink.dir) {
      console.warn('MAIL_SINK_DIR is not set: the dev mailbox is not checked.');
      return;
    }
    const adminPage = await signInAs(DEMO.admin);
    await adminPage.goto('/admin/mailbox');
    await adminPage.getByRole('heading', { name: 'Dev mailbox', level: 1 }).waitFor();
    const subject = (await adminPage.locator('summary').filter({ hasText: visit.siteName }).count()) > 0;
    expect(subject).toBe(true);
    const item = adminPage.locator('details').filter({ hasText: visit.siteName }).first();
    await item.locator('summary').click();
    const attachment = item.getByRole('link', { name: /service-report-.*\.pdf \(application\/pdf/ });
    await attachment.waitFor();
    await shot(adminPage, 'dev-mailbox-tablet');
    const href = await attachment.getAttribute('href');
    const res = await adminPage.request.get(href!);
    expect(res.status()).toBe(200);
    const pdf = await res.body();
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    writeFileSync(`${SHOTS}/mailed-report.pdf`, new Uint8Array(pdf));
    const render = spawnSync('pdftoppm', [
      '-png',
      '-r',
      '80',
      '-f',
      '1',
      '-l',
      '1',
      `${SHOTS}/mailed-report.pdf`,
      `${SHOTS}/mailed-report-page`,
    ]);
    if (render.error) console.warn('pdftoppm is not installed: the PDF page is not rendered (apt-get install -y poppler-utils).');
    else expect(render.status).toBe(0);
    await adminPage.close();
  }, 180_000);

  it('the office record prints without the e-mail panel or the navigation', async () => {
    const page = await signInAs(DEMO.technician);
    await page.goto(`/calls/${visit.callId}/report`);
    await page.getByRole('heading', { name: 'Service report', level: 1 }).waitFor();
    await page.emulateMedia({ media: 'print' });
    expect(await page.getByRole('heading', { name: 'E-mail the report' }).isVisible()).toBe(false);
    expect(await page.getByRole('navigation', { name: 'Report version' }).isVisible()).toBe(false);
    await shot(page, 'report-office-print');
    await page.close();
  });
});
