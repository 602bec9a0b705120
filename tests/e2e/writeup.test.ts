import { describe, expect, it } from 'vitest';
import { Jimp } from 'jimp';
import type { Page } from 'playwright-core';
import {
  PHONE,
  elementShot,
  screenshot,
  useServerAndBrowser,
  waitForSaved,
} from '../helpers/browser';
import { XSS_PAYLOADS } from '../helpers/xssPayloads';

const run = useServerAndBrowser({ timeout: 20_000 });
const { newPage, signIn } = run;

/** A photo-like test image drawn with jimp: a gradient with a dark block in it. */
async function photo(kind: 'image/png' | 'image/jpeg', width: number, height: number, hue: number) {
  const img = new Jimp({ width, height, color: 0xffffffff });
  const d = img.bitmap.data;
  for (let y = 0; y < height; y++)
    for (let x = 0; x < width; x++) {
      const i = (y * width + x) * 4;
      const inBlock = x > width * 0.3 && x < width * 0.7 && y > height * 0.35 && y < height * 0.65;
      d[i] = inBlock ? 40 : (x * 255) / width;
      d[i + 1] = inBlock ? 42 : (hue + (y * 200) / height) & 255;
      d[i + 2] = inBlock ? 46 : 140;
      d[i + 3] = 255;
    }
  return kind === 'image/png'
    ? img.getBuffer('image/png')
    : img.getBuffer('image/jpeg', { quality: 85 });
}

/** Waits until every image on the page has loaded (screenshots do not wait for them). */
async function imagesLoaded(page: Page) {
  await page.evaluate(() =>
    Promise.all(
      Array.from(document.images).map((img) => {
        img.loading = 'eager';
        return img.complete
          ? null
          : new Promise((r) => {
              img.addEventListener('load', r, { once: true });
              img.addEventListener('error', r, { once: true });
            });
      }),
    ),
  );
}

/** Counts of marking shapes drawn inside `scope`. */
async function shapes(page: Page, scope: string) {
  return page.evaluate((sel) => {
    const root = document.querySelector(sel);
    const count = (t: string) =>
      root?.querySelectorAll(`svg.lw-annot g[data-type="${t}"]`).length ?? 0;
    return {
      marker: count('marker'),
      arrow: count('arrow'),
      svgs: root?.querySelectorAll('svg.lw-annot').length ?? 0,
    };
  }, scope);
}

describe('a write-up with annotated photos, from draft to published, in the browser', () => {
  it('member writes and submits, moderator sees the markings and publishes, reader toggles them', async () => {
    const title = `Moving the sensor plug to the bracket ${Date.now().toString(36)}`;

    // ── The member writes the write-up ───────────────────────
    const member = await newPage();
    await signIn(member, 'member@example.test');
    await member.getByRole('link', { name: 'Write-ups' }).first().click();
    await member.waitForURL(/\/writeups$/);
    await member.locator('[data-doc]').first().waitFor();
    await screenshot(member, 'writeup-list-desktop');
    await member.getByRole('link', { name: 'New write-up' }).click();
    await member.waitForURL(/\/writeups\/new$/);

    await member.getByLabel('Title').fill(title);
    await member.waitForURL(/\/documents\/\d+\/edit$/);
    const docId = /\/documents\/(\d+)\/edit$/.exec(member.url())![1];

    const body = member.locator('[data-test="body"]');
    await body.click();
    await body.fill(
      'I moved the sensor plug 300 mm along the hose to a new bracket.\n\n## Steps\n\n1. Unplug the sensor.\n2. Splice in the extension.\n',
    );
    await member.locator('[data-test="insert-caution"]').click();
    await member
      .getByRole('menuitem')
      .filter({ hasText: 'Battery' })
      .or(member.locator('.q-menu .q-item', { hasText: 'Battery' }))
      .first()
      .click();
    await expect(body.inputValue()).resolves.toContain(':::caution battery');
    await member.locator('[data-test="preview"] .lw-caution--battery').waitFor();

    // Two photos, a PNG and a JPEG, with a progress bar and a processing state.
    await body.press('Control+End');
    const files = [
      { name: 'plug.png', mimeType: 'image/png', buffer: await photo('image/png', 900, 600, 30) },
      {
        name: 'loom.jpg',
        mimeType: 'image/jpeg',
        buffer: await photo('image/jpeg', 1200, 800, 120),
      },
    ];
    await member.locator('[data-test="image-file"]').setInputFiles(files);
    await member.locator('[data-test="upload-pending"]').first().waitFor();
    await screenshot(member, 'writeup-uploading');
    await member.locator('article.lw-wimg[data-image="2"]').waitFor({ timeout: 60_000 });
    await expect(member.locator('[data-test="upload-pending"]').count()).resolves.toBe(0);
    // Each photo is placed in the text where the cursor was.
    await expect(body.inputValue()).resolves.toMatch(/\(image:1\)[\s\S]*\(image:2\)/);
    await member.getByLabel('Caption of image 1').fill('The plug on its new bracket');
    await member.getByLabel('Caption of image 2').fill('Splices staggered along the loom');

    // Three markers and an arrow on the first photo.
    await member.locator('[data-test="annotate-1"]').click();
    const stage = member.locator('[data-test="annotator-layer"]');
    await stage.waitFor();
    await member.waitForTimeout(300);
    const box = (await stage.boundingBox())!;
    for (const [fx, fy] of [
      [0.25, 0.3],
      [0.5, 0.3],
      [0.75, 0.3],
    ])
      await member.mouse.click(box.x + box.width * fx, box.y + box.height * fy);
    await member.getByLabel(/Note for marker 3/).fill('Gauge sender');
    await member.locator('[data-tool="arrow"]').click();
    await member.mouse.move(box.x + box.width * 0.2, box.y + box.height * 0.85);
    await member.mouse.down();
    await member.mouse.move(box.x + box.width * 0.35, box.y + box.height * 0.65, { steps: 8 });
    await member.mouse.move(box.x + box.width * 0.45, box.y + box.height * 0.55, { steps: 8 });
    await member.mouse.up();
    await member.getByLabel(/Arrow text/).fill('Tie here');
    let drawn = await shapes(member, '[data-test="annotator"]');
    expect(drawn).toMatchObject({ marker: 3, arrow: 1 });
    // Move the second marker a little by dragging it.
    const m2 = member.locator('[data-test="annotator"] g[data-type="marker"]').nth(1);
    const m2box = (await m2.boundingBox())!;
    await member.mouse.move(m2box.x + m2box.width / 2, m2box.y + m2box.height / 2);
    await member.mouse.down();
    await member.mouse.move(m2box.x + m2box.width / 2 + 30, m2box.y + m2box.height / 2 + 20, {
      steps: 5,
    });
    await member.mouse.up();
    await elementShot(member, '.lw-wimgs__dialog', 'writeup-annotator-desktop');
    await member.locator('[data-test="annotator-done"]').click();
    await member.locator('.lw-wimgs__dialog').waitFor({ state: 'detached' });

    // A wire run of two wires.
    await member.locator('[data-test="add-wire-run"]').click();
    await member.getByLabel('Colour, wire 1').fill('GN/YE');
    await member.getByLabel('Size, wire 1').fill('0.5 mm²');
    await member.getByLabel('Role, wire 1').fill('signal');
    await member.getByLabel('From, wire 1').fill('sensor, old position');
    await member.getByLabel('Now ends at, wire 1').fill('bracket');
    await member.getByLabel('Added length, wire 1').fill('300');
    await member.locator('[data-test="add-wire"]').click();
    await member.getByLabel('Colour, wire 2').fill('BN/WH');
    await member.getByLabel('Size, wire 2').fill('0.5 mm²');
    await member.getByLabel('Role, wire 2').fill('low reference');
    await member.getByLabel('Current, wire 2').fill('0.5');
    const totals = member.locator('[data-test="wire-run-editor"] [data-test="wire-run-totals"]');
    await totals.locator('.lw-wrun__total').getByText('600 mm').waitFor();
    await totals
      .getByText(/4\s*splices/)
      .first()
      .waitFor();
    await totals
      .getByText(/4\s*heat-shrink sleeves/)
      .first()
      .waitFor();

    await waitForSaved(member);
    await imagesLoaded(member);
    await screenshot(member, 'writeup-editor-desktop');
    await member.getByRole('button', { name: 'Submit for review' }).click();
    await member.locator('[data-test="status"][data-status="submitted"]').waitFor();

    // The stored revision has the markings as data.
    const stored = await member.evaluate(
      async (id) => (await (await fetch(`/api/documents/${id}/editor`)).json()).revision.content,
      docId,
    );
    expect(stored.images).toHaveLength(2);
    expect(stored.images[0].annotations.map((a: { type: string }) => a.type)).toEqual([
      'marker',
      'marker',
      'marker',
      'arrow',
    ]);
    expect(stored.wireRun.wires[0]).toMatchObject({ color: 'GN/YE', addedLengthMm: 300 });

    // ── The moderator sees the markings and publishes ────────
    const moderator = await newPage();
    await signIn(moderator, 'moderator@example.test');
    await moderator.goto(`${run.url}/review?kind=writeup`);
    await moderator
      .locator('li.lw-queue__item', { hasText: title })
      .getByRole('button', { name: 'Claim and review' })
      .click();
    await moderator.waitForURL(/\/review\/\d+$/);
    await moderator.locator('[data-test="writeup"] figure[data-image="1"] svg.lw-annot').waitFor();
    drawn = await shapes(moderator, '[data-test="writeup"] figure[data-image="1"]');
    expect(drawn).toMatchObject({ marker: 3, arrow: 1 });
    await moderator
      .locator('[data-test="writeup"] figure[data-image="1"] .lw-legend')
      .getByText('Gauge sender')
      .waitFor();
    await moderator.locator('[data-test="image-send-back"]').first().waitFor();
    await imagesLoaded(moderator);
    await screenshot(moderator, 'writeup-review-page');
    for (const tick of await moderator.locator('.lw-checklist [role="checkbox"]').all())
      await tick.click();
    await moderator.getByRole('button', { name: 'Publish' }).click();
    await moderator.waitForURL(/\/review(\?.*)?$/);

    // ── A reader reads it with markings on and off ───────────
    const api = await (await fetch(`${run.url}/api/documents/${docId}`)).json();
    expect(api.revision.status).toBe('published');
    const reader = await newPage();
    await reader.goto(`${run.url}/documents/${api.slug}`);
    await reader.getByRole('heading', { name: title }).waitFor();
    const fig1 = 'figure[data-image="1"]';
    await reader.locator(`${fig1} svg.lw-annot`).waitFor();
    await reader
      .locator(`${fig1} img`)
      .evaluate((img: HTMLImageElement) =>
        img.complete ? null : new Promise((r) => img.addEventListener('load', r, { once: true })),
      );
    expect(await shapes(reader, fig1)).toMatchObject({ marker: 3, arrow: 1 });
    await reader.locator('[data-test="wire-run"]').getByText('GN/YE').first().waitFor();
    await reader.locator('.lw-caution--battery').waitFor();
    await elementShot(reader, fig1, 'writeup-figure-markings-on');
    await imagesLoaded(reader);
    await screenshot(reader, 'writeup-reader-desktop');

    await reader.locator('[data-test="markings-all"]').click();
    await expect(reader.locator(`${fig1} svg.lw-annot`).count()).resolves.toBe(0);
    await elementShot(reader, fig1, 'writeup-figure-markings-off');
    await reader.locator('[data-test="markings-all"]').click();
    await reader.locator(`${fig1} svg.lw-annot`).waitFor();
    // One image on its own, too.
    await reader.locator(`${fig1} [data-test="markings-toggle"]`).click();
    await expect(reader.locator(`${fig1} svg.lw-annot`).count()).resolves.toBe(0);

    // The flattened download.
    const [download] = await Promise.all([
      reader.waitForEvent('download'),
      reader
        .locator(`${fig1}`)
        .getByRole('button', { name: /with its markings/ })
        .click(),
    ]);
    expect(download.suggestedFilename()).toMatch(/-annotated\.(png|jpg)$/);

    // Inch-pound readers see inches.
    await reader.getByRole('button', { name: 'Show inch-pound units' }).first().click();
    await reader.locator('[data-test="wire-run"]').getByText('11.8 in').first().waitFor();

    // A phone-sized screen.
    const phone = await newPage({ viewport: PHONE });
    await phone.goto(`${run.url}/documents/${api.slug}`);
    await phone.getByRole('heading', { name: title }).waitFor();
    await phone.locator(`${fig1} svg.lw-annot`).waitFor();
    const width = await phone.evaluate(() => document.documentElement.scrollWidth);
    expect(width).toBeLessThanOrEqual(375);
    await imagesLoaded(phone);
    await screenshot(phone, 'writeup-reader-phone');
    await phone.locator('[data-test="markings-all"]').click();
    await elementShot(phone, fig1, 'writeup-figure-phone-markings-off');

    // On a touch screen: a tap places a marker on the second photo (this starts a new draft).
    const phoneEditor = await newPage({ viewport: PHONE, touch: true });
    await signIn(phoneEditor, 'member@example.test');
    await phoneEditor.goto(`${run.url}/documents/${docId}/edit`);
    await phoneEditor.locator('[data-test="body"]').waitFor();
    await screenshot(phoneEditor, 'writeup-editor-phone');
    await phoneEditor.locator('[data-test="annotate-2"]').tap();
    const touchStage = phoneEditor.locator('[data-test="annotator-layer"]');
    await touchStage.waitFor();
    await phoneEditor.waitForTimeout(300);
    const tb = (await touchStage.boundingBox())!;
    await phoneEditor.touchscreen.tap(tb.x + tb.width * 0.5, tb.y + tb.height * 0.5);
    await expect(
      phoneEditor.locator('[data-test="annotator"] g[data-type="marker"]').count(),
    ).resolves.toBe(1);
    await screenshot(phoneEditor, 'writeup-annotator-phone');
  }, 300_000);

  it('shows the demo write-ups with their drawn images, wire run and parts options', async () => {
    const page = await newPage();
    const list = await (await fetch(`${run.url}/api/writeups`)).json();
    const parts = list.items.find((i: { hasParts: boolean }) => i.hasParts);
    expect(
      list.items.filter((i: { images: number }) => i.images >= 2).length,
    ).toBeGreaterThanOrEqual(3);
    await page.goto(`${run.url}/documents/${parts.slug}`);
    await page.locator('[data-test="parts-list"]').waitFor();
    await page.getByText("Prices are the author's estimate", { exact: false }).first().waitFor();
    await expect(page.locator('[data-test="parts-list"] [data-diff]').count()).resolves.toBe(3);
    await page.locator('figure[data-image="1"] svg.lw-annot').waitFor();
    await page.locator('.lw-sheetcard').first().waitFor();
    await imagesLoaded(page);
    await screenshot(page, 'writeup-demo-parts-desktop');
    const phone = await newPage({ viewport: PHONE });
    await phone.goto(`${run.url}/documents/${parts.slug}`);
    await phone.locator('[data-test="parts-list"]').waitFor();
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(
      375,
    );
    await imagesLoaded(phone);
    await screenshot(phone, 'writeup-demo-parts-phone');
  }, 120_000);

  it('runs no script from XSS payloads in a write-up, in the editor preview or on the page', async () => {
    const page = await newPage();
    const dialogs: string[] = [];
    const ran: string[] = [];
    page.on('dialog', async (d) => {
      dialogs.push(d.message());
      await d.dismiss();
    });
    page.on('console', (m) => {
      if (m.text().includes('xss-ran')) ran.push(m.text());
    });
    await signIn(page, 'member2@example.test');
    // Every payload both as written (alert) and logging a marker if it runs.
    const payloads = [
      ...XSS_PAYLOADS,
      ...XSS_PAYLOADS.map((p) => p.replaceAll('alert(1)', "console.log('xss-ran')")),
    ];
    const created = await page.evaluate(async (text) => {
      const { token } = await (await fetch('/api/auth/csrf')).json();
      const res = await fetch('/api/documents', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token },
        body: JSON.stringify({ kind: 'writeup', title: 'Payloads', content: { body: text } }),
      });
      return res.json();
    }, payloads.join('\n\n'));
    expect(created.id).toBeTruthy();

    await page.goto(`${run.url}/documents/${created.id}/edit`);
    await page.locator('[data-test="preview"] .lw-wbody').waitFor();
    await page.waitForTimeout(1000);
    await page.goto(`${run.url}/documents/${created.slug}?revision=1`);
    await page.locator('[data-test="writeup"] .lw-wbody').waitFor();
    await page.waitForTimeout(1000);
    await screenshot(page, 'writeup-xss-page');

    const found = await page.evaluate(() => {
      const root = document.querySelector('[data-test="writeup"] .lw-wbody')!;
      const bad: string[] = [];
      for (const el of root.querySelectorAll('*')) {
        if (['SCRIPT', 'IFRAME', 'OBJECT', 'EMBED', 'STYLE', 'FORM'].includes(el.tagName))
          bad.push(el.tagName);
        for (const a of Array.from(el.attributes)) {
          // Our own components (icons, figures) set inline sizes; text from the body never may.
          const ours = !!el.closest('.q-icon, .lw-wfig, .lw-caution, .lw-sheetcard, .lw-sheetlink');
          if (/^on/i.test(a.name) || (a.name === 'style' && !ours))
            bad.push(`${el.tagName}[${a.name}]`);
          if (
            ['href', 'src', 'action', 'xlink:href'].includes(a.name) &&
            !/^(https?:\/\/|\/(?!\/)|#)/i.test(a.value)
          )
            bad.push(`${el.tagName}[${a.name}=${a.value}]`);
        }
      }
      return bad;
    });
    expect(found).toEqual([]);
    expect(dialogs).toEqual([]);
    expect(ran).toEqual([]);
  }, 120_000);
});
