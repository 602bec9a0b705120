import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import {
  PHONE,
  elementShot,
  printedPageCount,
  screenshot,
  useServerAndBrowser,
  waitForSaved,
} from '../helpers/browser';
import { DEMO_CONNECTOR_SLUGS } from '../../server/seed/connectors';

const run = useServerAndBrowser();
const { newPage, signIn } = run;

const cell = (page: Page, row: number, col: number) =>
  page.locator(`input[data-row="${row}"][data-col="${col}"]`);

/** Links end `side` to the published sheet found by `query`. */
async function linkEnd(page: Page, side: 'A' | 'B', query: string, slug: string) {
  const panel = page.locator(`[data-test="end-${side}"]`);
  await panel.getByLabel(`Find the connector sheet for end ${side}`).fill(query);
  await page.locator(`[data-test="choice-${slug}"]`).click();
  await panel.locator('[data-test="linked-sheet"]').waitFor();
}

/** A circuit typed by keyboard: Tab from cell to cell along the row. */
async function typeRow(page: Page, row: number, cells: string[]) {
  await cell(page, row, 0).click();
  for (const [i, value] of cells.entries()) {
    if (i > 0) await page.keyboard.press('Tab');
    if (value) await page.keyboard.type(value);
  }
}

const verdict = (page: Page) => page.locator('[data-test="verdict"]').innerText();

describe('an adapter sheet from draft to published, in the browser', () => {
  it('member builds and checks it, prints the build sheet and submits; moderator publishes; a reader opens the diagram', async () => {
    const title = `Brindlemoor 4.2 pump branch into a Brindlemoor 3.6 harness ${Date.now().toString(36)}`;
    const A = DEMO_CONNECTOR_SLUGS.bodyHarness8;
    const B = DEMO_CONNECTOR_SLUGS.bodyHarness6;

    // ── The member starts an adapter between two published sheets ──
    const member = await newPage();
    await signIn(member, 'member@example.test');
    await member.getByRole('link', { name: 'My documents' }).first().click();
    await member.getByRole('link', { name: 'New adapter sheet' }).click();
    await member.waitForURL(/\/adapters\/new$/);
    await member.getByLabel('Title').fill(title);
    await member.waitForURL(/\/documents\/\d+\/edit$/);
    const docId = /\/documents\/(\d+)\/edit$/.exec(member.url())![1];

    await linkEnd(member, 'A', 'rear body harness 8-way', A);
    await linkEnd(member, 'B', 'Brindlemoor 3.6 body harness', B);
    // The sheets' cavities fill in: 8 on end A, 6 on end B, none used yet.
    await member.locator('[data-test="end-A-usage"]').getByText('0 of 8 cavities used').waitFor();
    await member.locator('[data-test="end-B-usage"]').getByText('0 of 6 cavities used').waitFor();

    // ── Four circuits by keyboard; the fourth reuses cavity 3 on end B ──
    await typeRow(member, 0, ['1', '1', 'motor +', '14 AWG', 'GY', '300', '8']);
    await typeRow(member, 1, ['2', '2', 'ground', '14 AWG', 'BK', '300', '8']);
    await typeRow(member, 2, ['3', '3', 'signal', '20 AWG', 'VT/WH', '300']);
    await typeRow(member, 3, ['4', '3', 'low reference', '20 AWG', 'BK/VT', '300']);

    // The mistake is flagged while typing, on the cell that holds it.
    const reused = member.locator(
      'tr[data-index="3"] td[data-field="b"] [data-code="CAVITY_REUSED"]',
    );
    await reused.waitFor();
    await expect(reused.innerText()).resolves.toMatch(/Cavity 3 is also used by circuit 3/);
    // …and on the row that used the cavity first.
    await member
      .locator('tr[data-index="2"] td[data-field="b"] [data-code="CAVITY_REUSED"]')
      .waitFor();
    await expect(cell(member, 3, 1).getAttribute('aria-invalid')).resolves.toBe('true');
    await expect(verdict(member)).resolves.toMatch(/Does not build as written/);
    // Role of cavity 3 on end B is "signal" on the sheet, so the low reference is warned too.
    await member
      .locator('tr[data-index="3"] td[data-field="role"] [data-code="ROLE_MISMATCH"]')
      .waitFor();
    await elementShot(member, 'section[aria-labelledby="lw-ae-table"]', 'adapter-editor-finding');
    await screenshot(member, 'adapter-editor-findings');

    // Fix it in place: the message goes and the verdict turns.
    await cell(member, 3, 1).click();
    await member.keyboard.press('Control+A');
    await member.keyboard.type('4');
    await expect(reused.count()).resolves.toBe(0);
    await expect(verdict(member)).resolves.toMatch(/Builds as written/);
    const checkMs = Number(await member.locator('[data-test="check-ms"]').innerText());
    expect(checkMs).toBeLessThan(50);

    // Undo brings the mistake back, redo takes it away again.
    await member.keyboard.press('Control+Z');
    await expect(cell(member, 3, 1).inputValue()).resolves.toBe('3');
    await reused.waitFor();
    await member.keyboard.press('Control+Shift+Z');
    await expect(cell(member, 3, 1).inputValue()).resolves.toBe('4');
    await expect(reused.count()).resolves.toBe(0);

    // The summary: four circuits landed on each end, four unused cavities on end A.
    await expect(member.locator('[data-test="sum-circuits"]').innerText()).resolves.toBe('4');
    await expect(member.locator('[data-test="sum-landed-A"]').innerText()).resolves.toBe('4');
    await expect(member.locator('[data-test="sum-landed-B"]').innerText()).resolves.toBe('4');
    await member.locator('[data-test="end-A-usage"]').getByText('4 of 8 cavities used').waitFor();

    // The diagram follows the table: a wire per circuit, each with its code printed.
    const diagram = member.locator('[data-test="adapter-diagram"]');
    await diagram.scrollIntoViewIfNeeded();
    await expect(diagram.locator('g.lw-adiag__wire').count()).resolves.toBe(4);
    await diagram.locator('text.lw-adiag__code', { hasText: 'VT/WH' }).waitFor();
    await diagram.locator('text', { hasText: 'Viewed from: wire side' }).first().waitFor();
    await elementShot(member, '[data-test="adapter-diagram"]', 'adapter-editor-diagram');
    await waitForSaved(member);
    await screenshot(member, 'adapter-editor-clean');

    // A phone-width look at an editor with findings: the demo draft with its mistakes.
    const phone = await newPage({ viewport: PHONE });
    await signIn(phone, 'member@example.test');
    const mine = (await (await phone.request.get(`${run.url}/api/me/documents`)).json()) as Array<{
      id: number;
      kind: string;
      title: string;
    }>;
    const demoDraft = mine.find(
      (d) => d.kind === 'adapter' && /throttle body extension/.test(d.title),
    )!;
    await phone.goto(`${run.url}/documents/${demoDraft.id}/edit`);
    await phone.locator('[data-test="circuit-table"]').waitFor();
    await phone.locator('[data-code="CAVITY_REUSED"]').first().waitFor();
    await phone.locator('[data-code="OPEN_END"]').first().waitFor();
    await expect(verdict(phone)).resolves.toMatch(/Does not build as written/);
    await screenshot(phone, 'adapter-editor-phone');
    await elementShot(
      phone,
      'section[aria-labelledby="lw-ae-table"]',
      'adapter-editor-phone-table',
    );
    await phone.close();

    // ── The build sheet of the draft, on screen and printed ──
    await member.getByRole('button', { name: 'Build sheet' }).click();
    await member.waitForURL(new RegExp(`/documents/${docId}/build-sheet\\?draft=1$`));
    const sheet = member.locator('[data-test="build-sheet"]');
    await sheet.getByRole('heading', { name: title }).waitFor();
    await expect(sheet.locator('[data-test="cut-list"] tbody tr').count()).resolves.toBe(4);
    // Unsealed ends: one terminal per used cavity, no seals, no plugs.
    await expect(sheet.locator('[data-test="plugs-a"]').innerText()).resolves.toBe('0');
    await sheet.locator('[data-test="wire-totals"]').getByText('600 mm').first().waitFor();
    await sheet.locator('.lw-caution__title', { hasText: 'Fuse every new feed' }).waitFor();
    await sheet.locator('.lw-caution__title', { hasText: 'Never probe airbag' }).waitFor();
    await sheet.locator('.lw-caution__title', { hasText: 'Disconnect the battery' }).waitFor();
    await screenshot(member, 'adapter-build-sheet');
    for (const format of ['A4', 'Letter'] as const) {
      expect(await printedPageCount(member, format), `${format} pages`).toBe(1);
    }
    await member.emulateMedia({ media: 'print' });
    await expect(member.locator('.q-header').isVisible()).resolves.toBe(false);
    await expect(member.getByRole('button', { name: 'Print' }).isVisible()).resolves.toBe(false);
    await expect(sheet.locator('[data-test="adapter-diagram"]').isVisible()).resolves.toBe(true);
    await screenshot(member, 'adapter-build-sheet-print');
    await member.emulateMedia({ media: 'screen' });

    // ── Back to the editor and submit ──
    await member.getByRole('link', { name: 'Back to the editor' }).click();
    await member.waitForURL(new RegExp(`/documents/${docId}/edit$`));
    await member.getByRole('button', { name: 'Submit for review' }).click();
    await member.locator('[data-test="status"][data-status="submitted"]').waitFor();

    // ── The moderator reviews it with the check report and publishes ──
    const moderator = await newPage();
    await signIn(moderator, 'moderator@example.test');
    await moderator.goto(`${run.url}/review?kind=adapter`);
    const item = moderator.locator('li.lw-queue__item', { hasText: title });
    await item.getByRole('button', { name: 'Claim and review' }).click();
    await moderator.waitForURL(/\/review\/\d+$/);
    const findings = moderator.locator('.lw-findings');
    // The findings are the check report: no errors, the unused cavities as warnings.
    await findings.getByText('0 errors', { exact: false }).waitFor();
    await findings.getByText('Cavity 5 on end A is not used by any circuit.').waitFor();
    await expect(
      findings.getByText('Cavity 5 on end A is not used by any circuit.').count(),
    ).resolves.toBe(1);
    await moderator.locator('[data-test="verdict"]').getByText('Builds as written').waitFor();
    await moderator.locator('[data-test="adapter-diagram"]').waitFor();
    await screenshot(moderator, 'adapter-review-page');
    const publish = moderator.getByRole('button', { name: 'Publish' });
    for (const box of await moderator.locator('.lw-checklist [role="checkbox"]').all())
      await box.click();
    await expect(publish.isDisabled()).resolves.toBe(false);
    await publish.click();
    await moderator.waitForURL(/\/review(\?.*)?$/);

    // ── A signed-out reader opens the published adapter and its diagram ──
    const api = await (await fetch(`${run.url}/api/documents/${docId}`)).json();
    expect(api.revision.status).toBe('published');
    expect(api.findings.ok).toBe(true);
    const reader = await newPage();
    await reader.goto(`${run.url}/documents/${api.slug}`);
    await reader.getByRole('heading', { name: title }).waitFor();
    await reader.getByText('reviewed by Moss Tarrow', { exact: false }).waitFor();
    await reader.locator('[data-test="verdict"]').getByText('Builds as written').waitFor();
    const readerDiagram = reader.locator('[data-test="adapter-diagram"]');
    await expect(readerDiagram.locator('g.lw-adiag__wire').count()).resolves.toBe(4);
    // Every wire carries its code as text, never colour alone.
    for (const code of ['GY', 'BK', 'VT/WH', 'BK/VT'])
      await readerDiagram.locator('text.lw-adiag__code', { hasText: code }).first().waitFor();
    // Unused cavities are marked, and the legend says what the marks mean.
    await expect(
      readerDiagram.locator('[data-end="A"][data-cavity="5"] title').textContent(),
    ).resolves.toMatch(/unused/);
    await readerDiagram.getByText('unused cavity').waitFor();
    await reader.locator('.lw-caution__title', { hasText: 'Fuse every new feed' }).waitFor();
    await elementShot(reader, '[data-test="adapter-diagram"]', 'adapter-diagram-desktop');
    await screenshot(reader, 'adapter-sheet-desktop');

    const readerPhone = await newPage({ viewport: PHONE });
    await readerPhone.goto(`${run.url}/documents/${api.slug}`);
    await readerPhone.getByRole('heading', { name: title }).waitFor();
    await readerPhone.locator('[data-test="adapter-diagram"]').waitFor();
    await screenshot(readerPhone, 'adapter-sheet-phone');
    await elementShot(readerPhone, '[data-test="adapter-diagram"]', 'adapter-diagram-phone');
  }, 300_000);

  it('keeps the check fast in a 500-circuit table while typing', async () => {
    const page = await newPage();
    await signIn(page, 'member@example.test');
    await page.goto(`${run.url}/adapters/new`);
    await page.locator('[data-test="circuit-table"]').waitFor();
    for (const side of ['A', 'B'] as const) {
      const panel = page.locator(`[data-test="end-${side}"]`);
      await panel.getByRole('button', { name: 'Describe here' }).click();
      await panel.getByLabel('Cavity count').fill('520');
    }
    const colors = ['RD', 'BK', 'GN/YE', 'WH/BU', 'VT', 'BN', 'YE/BK', 'OG'];
    const rows = Array.from({ length: 500 }, (_, i) =>
      [i + 1, i + 1, 'signal', '20 AWG', colors[i % 8], 300, 1].join('\t'),
    ).join('\n');
    await cell(page, 0, 0).click();
    await page.evaluate((text) => {
      const el = document.querySelector('input[data-row="0"][data-col="0"]')!;
      const data = new DataTransfer();
      data.setData('text/plain', text);
      el.dispatchEvent(
        new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }),
      );
    }, rows);
    await page.waitForFunction(
      () => document.querySelector('[data-test="sum-circuits"]')?.textContent?.trim() === '500',
    );
    // Only a screenful of rows is in the page.
    expect(await page.locator('tr.lw-ct__row').count()).toBeLessThan(80);

    await page.evaluate(() => {
      const w = window as unknown as { __frames: number[] };
      w.__frames = [];
      document.addEventListener(
        'keydown',
        () => {
          const t0 = performance.now();
          requestAnimationFrame(() => setTimeout(() => w.__frames.push(performance.now() - t0)));
        },
        true,
      );
    });
    await cell(page, 7, 8).click();
    const checks: number[] = [];
    for (const ch of 'route along the loom') {
      await page.keyboard.type(ch);
      checks.push(Number(await page.locator('[data-test="check-ms"]').innerText()));
    }
    await expect(cell(page, 7, 8).inputValue()).resolves.toBe('route along the loom');
    const frames = await page.evaluate(
      () => (window as unknown as { __frames: number[] }).__frames,
    );
    const median = (a: number[]) => [...a].sort((x, y) => x - y)[Math.floor(a.length / 2)];
    console.log(
      `500 circuits: check per keystroke median ${median(checks).toFixed(2)} ms (max ${Math.max(...checks).toFixed(2)}), keystroke to painted frame median ${median(frames).toFixed(1)} ms`,
    );
    expect(median(checks)).toBeLessThan(8);

    // A cavity typed twice far down the table is flagged on its cell.
    await cell(page, 9, 1).click();
    await page.keyboard.press('Control+A');
    await page.keyboard.type('8');
    await page
      .locator('tr[data-index="9"] td[data-field="b"] [data-code="CAVITY_REUSED"]')
      .waitFor();
    await screenshot(page, 'adapter-editor-500');
  }, 180_000);
});
