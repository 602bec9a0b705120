import { describe, expect, it } from 'vitest';
import {
  PHONE,
  elementShot,
  printedPageCount,
  screenshot,
  useServerAndBrowser,
  waitForSaved,
} from '../helpers/browser';

const run = useServerAndBrowser();
const { newPage, signIn } = run;

/** The six pins typed at the bench: role, colour, size. */
const PINS: Array<[string, string, string]> = [
  ['5 V reference', 'GY', '20 AWG'],
  ['signal', 'GN/YE', '20 AWG'],
  ['low reference', 'BK/WH', '20 AWG'],
  ['5 V reference', 'GY/RD', '0.5 mm2'],
  ['signal', 'WH', '20 AWG'],
  ['low reference', 'BN', '20 AWG'],
];

describe('a connector sheet from draft to published, in the browser', () => {
  it('member drafts and submits, moderator returns, member fixes, moderator publishes, reader mirrors', async () => {
    const title = `Pedal position sensor, twin track ${Date.now().toString(36)}`;

    // ── The member drafts the sheet ──────────────────────────
    const member = await newPage();
    await signIn(member, 'member@example.test');
    await member.getByRole('link', { name: 'My documents' }).first().click();
    await member.getByRole('link', { name: 'New connector sheet' }).click();
    await member.waitForURL(/\/connectors\/new$/);

    await member.getByLabel('Title').fill(title);
    await member.getByLabel('Component it plugs into').fill('accelerator pedal');
    await member.getByLabel('Cavity count').fill('6');
    await member.getByLabel('Rows').fill('2');
    await member.getByLabel('Columns').fill('3');
    await member.getByRole('radio', { name: 'Socket housing (female terminals)' }).click();
    await member.getByRole('radio', { name: 'Mating face' }).click();
    // The first save creates the document and moves to its edit address.
    await member.waitForURL(/\/documents\/\d+\/edit$/);
    const docId = /\/documents\/(\d+)\/edit$/.exec(member.url())![1];

    // Six pins by keyboard: Tab across a row, Enter down a column.
    await member.getByLabel('Circuit role, row 1, cavity 1').click();
    for (const [i, [role, color, size]] of PINS.entries()) {
      await member.keyboard.type(role);
      await member.keyboard.press('Tab');
      await member.keyboard.type(color);
      await member.keyboard.press('Tab');
      await member.keyboard.type(size);
      if (i < PINS.length - 1) {
        await member.keyboard.press('Enter'); // size of the next row
        await member.keyboard.press('Shift+Tab');
        await member.keyboard.press('Shift+Tab'); // role of the next row
      }
    }
    const focused = await member.evaluate(() => document.activeElement?.getAttribute('aria-label'));
    expect(focused).toBe('Wire size, row 6, cavity 6');
    for (const [i, [role, color]] of PINS.entries()) {
      await expect(
        member.getByLabel(`Circuit role, row ${i + 1}, cavity ${i + 1}`).inputValue(),
      ).resolves.toBe(role);
      await expect(
        member.getByLabel(`Wire colour, row ${i + 1}, cavity ${i + 1}`).inputValue(),
      ).resolves.toBe(color);
    }

    // A wrong colour gets a message beside its cell, and goes away when fixed.
    const colour6 = member.getByLabel('Wire colour, row 6, cavity 6');
    await colour6.fill('BW');
    await member.getByText('"BW" is not a known wire colour', { exact: false }).waitFor();
    await elementShot(
      member,
      'section[aria-labelledby="lw-ce-pins"]',
      'connector-editor-cell-message',
    );
    await colour6.fill('BN');
    await expect(
      member.getByText('"BW" is not a known wire colour', { exact: false }).count(),
    ).resolves.toBe(0);

    await waitForSaved(member);
    await screenshot(member, 'connector-editor');
    await member.getByRole('button', { name: 'Submit for review' }).click();
    await member.locator('[data-test="status"][data-status="submitted"]').waitFor();
    // Locked while in review; withdrawing makes it a draft again.
    await expect(
      member.getByLabel('Wire colour, row 1, cavity 1').getAttribute('readonly'),
    ).resolves.not.toBeNull();
    await member.getByRole('button', { name: 'Withdraw to edit' }).click();
    await member.locator('[data-test="status"][data-status="draft"]').waitFor();
    await member.getByRole('button', { name: 'Submit for review' }).click();
    await member.locator('[data-test="status"][data-status="submitted"]').waitFor();

    // ── The moderator returns it with a note ─────────────────
    const moderator = await newPage();
    await signIn(moderator, 'moderator@example.test');
    await moderator.getByRole('link', { name: 'Review queue' }).first().click();
    const item = moderator.locator('li.lw-queue__item', { hasText: title });
    await item.getByRole('button', { name: 'Claim and review' }).click();
    await moderator.waitForURL(/\/review\/\d+$/);
    const diff = moderator.locator('[data-test="diff"]');
    await diff.getByText('Nothing is published yet', { exact: false }).waitFor();
    await expect(diff.locator('tr[data-status="added"]').count()).resolves.toBe(6);
    await moderator.getByText('The side each drawing is viewed from is stated').waitFor();
    await screenshot(moderator, 'connector-review-page');

    const note =
      'Cavity 5: the signal wire on this pedal is WH/BU, not plain white. Please check and fix.';
    await moderator.getByLabel('Note to the author').fill(note);
    await moderator.getByRole('button', { name: 'Return with a note' }).click();
    await moderator.waitForURL(/\/review(\?.*)?$/);
    await expect(moderator.locator('li.lw-queue__item', { hasText: title }).count()).resolves.toBe(
      0,
    );

    // ── The member sees the note, fixes it, resubmits ────────
    await member.goto(`${run.url}/me/documents`);
    const mine = member.locator('li.lw-mydoc', { hasText: title });
    await mine.locator('[data-status="returned"]').waitFor();
    await mine.getByText(note).waitFor();
    await screenshot(member, 'connector-my-documents');
    await mine.getByRole('link', { name: 'Fix and resubmit' }).click();
    await member.waitForURL(new RegExp(`/documents/${docId}/edit$`));
    await member.locator('[data-test="moderator-note"]').getByText(note).waitFor();
    const colour5 = member.getByLabel('Wire colour, row 5, cavity 5');
    await colour5.click();
    await member.keyboard.press('Control+A');
    await member.keyboard.type('WH/BU');
    await waitForSaved(member);
    await member.getByRole('button', { name: 'Resubmit for review' }).click();
    await member.locator('[data-test="status"][data-status="submitted"]').waitFor();

    // ── The moderator publishes ──────────────────────────────
    await moderator.goto(`${run.url}/review`);
    await moderator
      .locator('li.lw-queue__item', { hasText: title })
      .getByRole('button', { name: 'Claim and review' })
      .click();
    await moderator.waitForURL(/\/review\/\d+$/);
    await moderator.locator('[data-test="diff"]').getByText('WH/BU').first().waitFor();
    const publish = moderator.getByRole('button', { name: 'Publish' });
    await expect(publish.isDisabled()).resolves.toBe(true);
    for (const box of await moderator.locator('.lw-checklist [role="checkbox"]').all())
      await box.click();
    await expect(publish.isDisabled()).resolves.toBe(false);
    await publish.click();
    await moderator.waitForURL(/\/review(\?.*)?$/);

    // ── A signed-out reader opens the sheet and mirrors it ───
    const api = await (await fetch(`${run.url}/api/documents/${docId}`)).json();
    expect(api.revision.status).toBe('published');
    const slug: string = api.slug;

    const reader = await newPage();
    await reader.goto(`${run.url}/documents/${slug}`);
    await reader.getByRole('heading', { name: title }).waitFor();
    await reader.getByText('reviewed by Moss Tarrow', { exact: false }).waitFor();
    const svgText = reader.locator('svg.lw-pinmap__svg text.lw-pinmap__viewtext');
    await expect(svgText.textContent()).resolves.toMatch(/Viewed from: mating face/);
    await reader
      .locator('.lw-caution__title', { hasText: "Follow the vehicle's service information" })
      .waitFor();
    const table = reader.locator('[data-test="pin-table"]');
    await table.getByText('WH/BU').waitFor();
    await elementShot(reader, 'figure.lw-pinmap', 'connector-pinmap-desktop');
    await screenshot(reader, 'connector-sheet-desktop');

    const cavity1X = () =>
      reader.locator('g[data-cavity="1"] circle').first().getAttribute('cx').then(Number);
    const before = await cavity1X();
    await reader.getByRole('button', { name: 'Mirror to wire side' }).click();
    await expect(svgText.textContent()).resolves.toMatch(/Viewed from: wire side/);
    const after = await cavity1X();
    expect(after).toBeGreaterThan(before); // cavity 1 moves from the left to the right
    await elementShot(reader, 'figure.lw-pinmap', 'connector-pinmap-mirrored');
    await reader.getByRole('button', { name: 'Mirror to mating face' }).click();
    await expect(cavity1X()).resolves.toBe(before);

    // Role on tap.
    await reader.locator('g[data-cavity="2"]').click();
    await reader.getByRole('dialog', { name: 'Cavity 2' }).getByText('signal').waitFor();
    await elementShot(reader, 'figure.lw-pinmap', 'connector-pinmap-popover');

    // The print layout fits one A4 and one Letter page, without the navigation.
    await reader.keyboard.press('Escape');
    for (const format of ['A4', 'Letter'] as const) {
      expect(await printedPageCount(reader, format), `${format} pages`).toBe(1);
    }
    await reader.emulateMedia({ media: 'print' });
    await expect(reader.locator('.q-header').isVisible()).resolves.toBe(false);
    await screenshot(reader, 'connector-sheet-print');
    await reader.emulateMedia({ media: 'screen' });

    // A phone-sized screen.
    const phone = await newPage({ viewport: PHONE });
    await phone.goto(`${run.url}/documents/${slug}`);
    await phone.getByRole('heading', { name: title }).waitFor();
    const svgBox = await phone.locator('svg.lw-pinmap__svg').boundingBox();
    expect(svgBox!.width).toBeLessThanOrEqual(375);
    await elementShot(phone, 'figure.lw-pinmap', 'connector-pinmap-phone');
    await screenshot(phone, 'connector-sheet-phone');
  }, 240_000);

  it('shows a moderator that they cannot decide on their own submission', async () => {
    const page = await newPage();
    await signIn(page, 'moderator@example.test');
    const created = await page.evaluate(async () => {
      const { token } = await (await fetch('/api/auth/csrf')).json();
      const headers = { 'Content-Type': 'application/json', 'X-CSRF-Token': token };
      const doc = await (
        await fetch('/api/documents', {
          method: 'POST',
          headers,
          body: JSON.stringify({
            kind: 'connector',
            title: 'Moderator-made lamp plug',
            content: {
              cavityCount: 2,
              labels: 'numeric',
              view: 'wire-side',
              housing: 'pin',
              pins: [],
            },
          }),
        })
      ).json();
      await fetch(`/api/documents/${doc.id}/submit`, { method: 'POST', headers });
      return doc;
    });
    await page.goto(`${run.url}/review/${created.revision.id}`);
    await page.locator('[data-test="own-submission"]').waitFor();
    await page.locator('[data-test="cannot-decide"]').waitFor();
    await expect(page.getByRole('button', { name: 'Publish' }).count()).resolves.toBe(0);
    await screenshot(page, 'connector-review-own');
  }, 60_000);

  it('shows a save conflict between two tabs and keeps the chosen version', async () => {
    const first = await newPage();
    await signIn(first, 'member2@example.test');
    const doc = await first.evaluate(async () => {
      const { token } = await (await fetch('/api/auth/csrf')).json();
      const res = await fetch('/api/documents', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': token },
        body: JSON.stringify({
          kind: 'connector',
          title: 'Two-tab lamp plug',
          content: {
            cavityCount: 2,
            labels: 'numeric',
            view: 'wire-side',
            housing: 'socket',
            pins: [],
          },
        }),
      });
      return res.json();
    });
    const edit = `${run.url}/documents/${doc.id}/edit`;
    await first.goto(edit);
    const second = await first.context().newPage();
    second.setDefaultTimeout(15_000);
    await second.goto(edit);
    await second.getByLabel('Circuit role, row 1, cavity 1').waitFor();

    await first.getByLabel('Circuit role, row 1, cavity 1').fill('battery feed');
    await waitForSaved(first);
    await second.getByLabel('Circuit role, row 2, cavity 2').fill('ground');
    const dialog = second.getByRole('alertdialog');
    await dialog.getByText('This draft was changed somewhere else').waitFor();
    await dialog.getByText('battery feed').first().waitFor(); // the stored version's row, in the comparison
    await screenshot(second, 'connector-conflict');
    await dialog.getByRole('button', { name: 'Keep my version' }).click();
    await waitForSaved(second);

    const stored = await second.evaluate(
      async (id) =>
        (await (await fetch(`/api/documents/${id}/editor`)).json()).revision.content.pins,
      doc.id,
    );
    expect(stored).toEqual([expect.objectContaining({ cavity: '2', role: 'ground' })]);
  }, 90_000);
});
