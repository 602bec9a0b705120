import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, useServerAndBrowser } from '../helpers/browser';

const run = useServerAndBrowser();

const COOLANT = 'Quorvane T3 coolant temperature sensor, 3-cavity';

async function resultTitles(page: Page): Promise<string[]> {
  await page.locator('[data-test="results"]').waitFor();
  return page.locator('[data-test="results"] .lw-result__title').allInnerTexts();
}

/** What the reader sees without scrolling (the full-page shots of a phone are hard to read). */
const viewportShot = (page: Page, name: string) => screenshot(page, name, { fullPage: false });

/** Waits until the results show exactly what the URL asks for (no stale list). */
async function settled(page: Page) {
  await page.waitForLoadState('networkidle');
  await page.locator('.lw-lookup__list--stale').waitFor({ state: 'detached' });
}

describe('a reader looking up a connector', () => {
  for (const viewport of [
    { name: 'desktop', width: 1280, height: 860 },
    { name: 'phone', width: 375, height: 740 },
  ]) {
    it(`types part of a name, narrows by cavity count, opens the sheet and comes back (${viewport.name})`, async () => {
      const page = await run.newPage({
        viewport: { width: viewport.width, height: viewport.height },
      });
      const errors: string[] = [];
      page.on('pageerror', (e) => errors.push(String(e)));
      await page.goto(run.url);
      await page.locator('[data-test="results"]').waitFor();
      await screenshot(page, `lookup-${viewport.name}-home`);
      await viewportShot(page, `lookup-${viewport.name}-home-top`);

      // A few keystrokes: suggestions appear as you type.
      const box = page.getByRole('combobox', { name: /^Search connector sheets/ });
      await box.click();
      await box.pressSequentially('sens', { delay: 40 });
      await page.locator('[data-test="suggestion"]').first().waitFor();
      await viewportShot(page, `lookup-${viewport.name}-suggestions`);
      await box.press('Enter');
      await page.waitForURL(/[?&]q=sens/);
      await settled(page);
      const all = await resultTitles(page);
      expect(all).toContain(COOLANT);
      expect(all.length).toBeGreaterThan(4);

      // Narrow by cavity count.
      if (viewport.name === 'phone') await page.locator('[data-test="open-filters"]').click();
      await page.getByRole('combobox', { name: 'Cavities' }).click();
      await page.getByRole('option', { name: /^3 cavities/ }).click();
      await page.waitForURL(/[?&]cavities=3/);
      if (viewport.name === 'phone') {
        await viewportShot(page, `lookup-${viewport.name}-filters`);
        await page.locator('[data-test="close-filters"]').click();
      }
      await settled(page);
      const narrowed = await resultTitles(page);
      expect(narrowed).toContain(COOLANT);
      expect(narrowed.length).toBeLessThan(all.length);
      await expect(page.getByText('3 cavities', { exact: true }).first().isVisible()).resolves.toBe(
        true,
      );
      await screenshot(page, `lookup-${viewport.name}-narrowed`);
      await viewportShot(page, `lookup-${viewport.name}-narrowed-top`);
      const searchUrl = page.url();

      // Open the sheet, then come back with the browser's back button.
      await page.getByRole('link', { name: COOLANT }).click();
      await page.waitForURL(/\/documents\/quorvane-t3-coolant-temperature-sensor-3-cavity/);
      await page.getByRole('heading', { name: COOLANT }).first().waitFor();
      await screenshot(page, `lookup-${viewport.name}-sheet`);
      await page.goBack();
      await page.waitForURL(searchUrl);
      expect(await resultTitles(page)).toEqual(narrowed);
      await expect(
        page.getByRole('combobox', { name: /^Search connector sheets/ }).inputValue(),
      ).resolves.toBe('sens');
      expect(errors).toEqual([]);
      await page.close();
    }, 90_000);
  }

  it('opens a sheet straight from a suggestion', async () => {
    const page = await run.newPage({ viewport: { width: 375, height: 740 } });
    await page.goto(run.url);
    const box = page.getByRole('combobox', { name: /^Search connector sheets/ });
    await box.click();
    await box.pressSequentially('pedal', { delay: 40 });
    await page.getByRole('option', { name: /accelerator pedal position sensor, 6-cavity/ }).click();
    await page.waitForURL(
      /\/documents\/brindlemoor-4-2-accelerator-pedal-position-sensor-6-cavity/,
    );
    await page.close();
  }, 60_000);

  it('explains an empty result and offers what to try; a typo still finds the sheet', async () => {
    const page = await run.newPage({ viewport: { width: 1280, height: 860 } });
    await page.goto(`${run.url}/search?q=coolnat`);
    await settled(page);
    await page.getByText(/showing results for/i).waitFor();
    expect(await resultTitles(page)).toContain(COOLANT);
    await page.goto(`${run.url}/search?q=zeppelin&cavities=3`);
    await page.locator('[data-test="no-results"]').waitFor();
    await expect(page.getByText('clear the filters').isVisible()).resolves.toBe(true);
    await expect(page.getByRole('link', { name: 'Sign in' }).last().isVisible()).resolves.toBe(
      true,
    );
    await screenshot(page, 'lookup-desktop-empty');
    await page.close();
  }, 60_000);

  it('browses by component and by cavity count', async () => {
    const page = await run.newPage({ viewport: { width: 1280, height: 860 } });
    await page.goto(`${run.url}/browse`);
    await page.getByRole('link', { name: 'fuel pump module', exact: true }).click();
    await page.waitForURL(/component=fuel/);
    await settled(page);
    expect(await resultTitles(page)).toEqual(['Brindlemoor 4.2 fuel pump module plug, 10-cavity']);
    await page.goto(`${run.url}/browse`);
    await screenshot(page, 'lookup-desktop-browse');
    await page.locator('a[href*="cavities=12"]').first().click();
    await settled(page);
    expect(await resultTitles(page)).toContain('Quorvane T3 engine control module plug C2, 12-way');
    await page.close();
  }, 60_000);
});
