import { describe, expect, it } from 'vitest';
import { screenshot, useServerAndBrowser } from '../helpers/browser';

const run = useServerAndBrowser();

describe('a new member in the browser', () => {
  it('registers, opens the verification link from the mailbox, signs in, sees name and role, signs out', async () => {
    const page = await run.browser.newPage();
    page.setDefaultTimeout(10_000);
    const email = `bench.${Date.now()}@example.test`;
    await page.goto(`${run.url}/register`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Display name').fill('Bench Tester');
    await page.getByLabel('Password', { exact: true }).fill('ferrule-and-crimp-88');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page
      .getByText(/check your e-mail/i)
      .first()
      .waitFor();
    await screenshot(page, 'accounts-registered');

    await page.goto(`${run.url}/dev/mail`);
    await page.getByText('Confirm your e-mail address for Loomwright').first().click();
    const link = page.locator('a[href*="/verify-email?token="]').first();
    await link.waitFor();
    const href = await link.getAttribute('href');
    expect(href).toMatch(/\/verify-email\?token=/);
    await screenshot(page, 'accounts-mailbox');
    const verifyUrl = new URL(href!, run.url);
    await page.goto(`${run.url}${verifyUrl.pathname}${verifyUrl.search}`);
    await page
      .getByText(/verified|confirmed/i)
      .first()
      .waitFor();

    await page.goto(`${run.url}/sign-in`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password', { exact: true }).fill('ferrule-and-crimp-88');
    await page.getByRole('button', { name: 'Sign in' }).click();
    const account = page.getByRole('button', { name: 'Account menu for Bench Tester' });
    await account.waitFor();
    await expect(account.textContent()).resolves.toMatch(/member/i);
    await screenshot(page, 'accounts-signed-in');

    await account.click();
    await page.getByText('Sign out').click();
    await page.getByRole('link', { name: 'Sign in' }).first().waitFor();
    const me = await page.evaluate(() => fetch('/api/auth/me').then((r) => r.status));
    expect(me).toBe(401);
    await page.close();
  }, 90_000);

  it('loads the built page without any request leaving this machine', async () => {
    const page = await run.browser.newPage();
    const outside: string[] = [];
    page.on('request', (req) => {
      const url = new URL(req.url());
      if (
        !['127.0.0.1', 'localhost'].includes(url.hostname) &&
        !['data:', 'blob:'].includes(url.protocol)
      )
        outside.push(req.url());
    });
    await page.goto(`${run.url}/`, { waitUntil: 'networkidle' });
    await page.goto(`${run.url}/sign-in`, { waitUntil: 'networkidle' });
    expect(outside).toEqual([]);
    // Fonts come from the app itself.
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      return [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family);
    });
    expect(fonts.join(' ')).toMatch(/Roboto/);
    await page.close();
  });
});
