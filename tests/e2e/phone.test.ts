import { beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { elementShot, screenshot, useServerAndBrowser } from '../helpers/browser';

/** A small phone, portrait. */
const PHONE = { width: 375, height: 740 };

const run = useServerAndBrowser({ viewport: PHONE });

type Who = 'reader' | 'member' | 'moderator' | 'admin';
const EMAIL: Record<Exclude<Who, 'reader'>, string> = {
  member: 'member@example.test',
  moderator: 'moderator@example.test',
  admin: 'admin@example.test',
};

interface Overflow {
  scrollWidth: number;
  innerWidth: number;
  /** Elements past the window's right edge that no scroller or clip of their own holds in. */
  outside: string[];
}

/**
 * How wide the page is against the window, and what sticks out past the right edge. The
 * second catches what the first cannot: a fixed header is not part of the scrollable
 * page, so a header wider than the phone is simply cut off.
 */
function overflowOf(page: Page): Promise<Overflow> {
  return page.evaluate(() => {
    const width = window.innerWidth;
    const outside: string[] = [];
    const name = (el: Element) => {
      const cls = el.getAttribute('class')?.trim().split(/\s+/).slice(0, 3).join('.');
      const test = el.getAttribute('data-test');
      const label = el.getAttribute('aria-label');
      return `${el.tagName.toLowerCase()}${cls ? `.${cls}` : ''}${test ? `[data-test=${test}]` : ''}${label ? ` "${label}"` : ''}`;
    };
    for (const el of document.querySelectorAll('body *')) {
      const box = el.getBoundingClientRect();
      if (box.width <= 1 || box.height <= 1 || box.right <= width + 0.5) continue;
      if (getComputedStyle(el).visibility === 'hidden') continue;
      let held = false;
      for (let up = el.parentElement; up && up !== document.body; up = up.parentElement) {
        if (
          getComputedStyle(up).overflowX !== 'visible' &&
          up.getBoundingClientRect().right <= width + 0.5
        ) {
          held = true;
          break;
        }
      }
      if (!held) outside.push(`${name(el)} reaches ${Math.round(box.right)} px`);
    }
    return {
      scrollWidth: document.documentElement.scrollWidth,
      innerWidth: width,
      outside: outside.slice(0, 12),
    };
  });
}

async function expectFits(page: Page, what: string) {
  const o = await overflowOf(page);
  expect(o.innerWidth, 'the window is phone-sized').toBe(PHONE.width);
  expect(o.scrollWidth, `${what}: the page scrolls sideways`).toBeLessThanOrEqual(o.innerWidth);
  expect(o.outside, `${what}: elements past the right edge`).toEqual([]);
}

/** Opens `path`, waits for its heading and its data, and checks and shoots it. */
async function visit(page: Page, path: string, shot: string, ready?: string) {
  const errors: string[] = [];
  const onError = (e: Error) => errors.push(String(e));
  page.on('pageerror', onError);
  await page.goto(`${run.url}${path}`);
  await page.locator('h1').first().waitFor();
  if (ready) await page.locator(ready).first().waitFor();
  await page.waitForLoadState('networkidle');
  await page.evaluate(() => document.fonts.ready.then(() => undefined));
  // Sections the browser skips while off screen (content-visibility: auto) neither count
  // for the page's width nor show in a full-page shot: draw them all.
  await page.evaluate(() => {
    for (const el of document.querySelectorAll<HTMLElement>('main *')) {
      if (getComputedStyle(el).contentVisibility === 'auto') el.style.contentVisibility = 'visible';
    }
  });
  await page.waitForTimeout(200);
  await expectFits(page, path);
  await screenshot(page, `phone-${shot}`);
  page.off('pageerror', onError);
  expect(errors, `${path}: page errors`).toEqual([]);
}

/** The adapter diagram is stacked, does not scroll, and prints every circuit's code. */
async function expectStackedDiagram(page: Page, shot: string) {
  const figure = page.locator('figure.lw-adiag').first();
  await figure.scrollIntoViewIfNeeded();
  await expect(figure.getAttribute('data-layout')).resolves.toBe('stacked');
  const fit = await figure.evaluate((el) => {
    const wrap = el.querySelector('.lw-adiag__wrap')!;
    const svg = el.querySelector('svg')!.getBoundingClientRect();
    const inside = (r: DOMRect) =>
      r.left >= svg.left - 1 && r.right <= svg.right + 1 && r.width > 0;
    const codes = [...el.querySelectorAll('text.lw-adiag__code')];
    const cavities = [...el.querySelectorAll('text.lw-adiag__label')];
    const sizes = codes.map((t) => parseFloat(getComputedStyle(t).fontSize));
    // The drawing's scale on screen: 1 when it is drawn at its own width.
    const scale = svg.width / Number(el.querySelector('svg')!.getAttribute('width'));
    return {
      scrolls: wrap.scrollWidth > wrap.clientWidth + 1,
      wires: el.querySelectorAll('g.lw-adiag__wire').length,
      codes: codes.length,
      codesInside: codes.every((t) => inside(t.getBoundingClientRect())),
      cavitiesInside: cavities.every((t) => inside(t.getBoundingClientRect())),
      smallestCode: Math.min(...sizes) * scale,
    };
  });
  expect(fit.scrolls, 'the diagram scrolls sideways').toBe(false);
  expect(fit.wires).toBeGreaterThan(0);
  expect(fit.codes, 'a printed code per circuit').toBe(fit.wires);
  expect(fit.codesInside, 'every code inside the drawing').toBe(true);
  expect(fit.cavitiesInside, 'every cavity label inside the drawing').toBe(true);
  expect(fit.smallestCode, 'codes drawn at a readable size (px)').toBeGreaterThanOrEqual(10);
  // A window as tall as the drawing, so the fixed header does not cover part of the shot;
  // the width, and so the layout, stay the phone's.
  const height = await figure.evaluate((el) => el.getBoundingClientRect().height);
  await page.setViewportSize({ width: PHONE.width, height: Math.ceil(height) + 160 });
  await figure.evaluate((el) => el.scrollIntoView({ block: 'center' }));
  await elementShot(page, 'figure.lw-adiag', `phone-${shot}-diagram`);
  await page.setViewportSize(PHONE);
}

interface Found {
  connector: string;
  adapters: string[];
  writeups: string[];
  /** The member's own documents to edit, one of each kind they have. */
  edits: Array<{ kind: string; id: number }>;
  /** One review per kind in the queue. */
  reviews: Array<{ kind: string; revisionId: number }>;
}
const found: Found = { connector: '', adapters: [], writeups: [], edits: [], reviews: [] };
const pages = new Map<Who, Page>();

async function pageAs(who: Who): Promise<Page> {
  let page = pages.get(who);
  if (!page) {
    page = who === 'reader' ? await run.newPage() : await run.signedInPage(EMAIL[who]);
    pages.set(who, page);
  }
  return page;
}

async function getJson<T>(page: Page, path: string): Promise<T> {
  const answer = await page.request.get(`${run.url}${path}`);
  expect(answer.status(), path).toBe(200);
  return (await answer.json()) as T;
}

beforeAll(async () => {
  const reader = await pageAs('reader');
  type Items = { items: Array<{ slug: string }> };
  // The connector with the most cavities draws the widest pin map.
  const connectors = await getJson<Items>(reader, '/api/search?kind=connector&sort=cavities');
  found.connector = connectors.items[0].slug;
  found.adapters = (await getJson<Items>(reader, '/api/search?kind=adapter')).items.map(
    (i) => i.slug,
  );
  found.writeups = (await getJson<Items>(reader, '/api/writeups')).items.map((i) => i.slug);

  const mine = await getJson<Array<{ id: number; kind: string }>>(
    await pageAs('member'),
    '/api/me/documents',
  );
  for (const kind of ['connector', 'adapter', 'writeup']) {
    const doc = mine.find((d) => d.kind === kind);
    if (doc) found.edits.push({ kind, id: doc.id });
  }
  const queue = await getJson<Array<{ kind: string; revisionId: number; own: boolean }>>(
    await pageAs('moderator'),
    '/api/review/queue',
  );
  for (const kind of ['connector', 'adapter', 'writeup']) {
    const item = queue.find((q) => q.kind === kind && !q.own);
    if (item) found.reviews.push({ kind, revisionId: item.revisionId });
  }
}, 120_000);

describe('every main page on a 375 px phone', () => {
  it('notices a page wider than the phone, and a header cut off at the edge', async () => {
    const page = await pageAs('member');
    await page.goto(`${run.url}/`);
    await page.locator('h1').first().waitFor();
    await page.evaluate(() => {
      const wide = document.createElement('div');
      wide.style.width = '420px';
      wide.style.height = '4px';
      wide.id = 'too-wide';
      document.querySelector('main')!.append(wide);
    });
    const page1 = await overflowOf(page);
    expect(page1.scrollWidth).toBeGreaterThan(page1.innerWidth);
    await page.evaluate(() => {
      document.getElementById('too-wide')!.remove();
      const extra = document.createElement('button');
      extra.textContent = 'A button that does not fit';
      extra.style.flex = 'none';
      extra.style.width = '160px';
      document.querySelector('.q-header .q-toolbar')!.append(extra);
    });
    const header = await overflowOf(page);
    expect(header.scrollWidth).toBe(header.innerWidth);
    expect(header.outside.length).toBeGreaterThan(0);
  }, 60_000);

  it('look up, search and browse fit (signed out and signed in)', async () => {
    const reader = await pageAs('reader');
    await visit(reader, '/', 'home', '[data-test="results"]');
    await visit(reader, '/search?q=sensor', 'search', '[data-test="results"]');
    await visit(reader, '/browse', 'browse');
    await visit(reader, '/writeups', 'writeups');
    // Signed in, the header holds the bell and the account menu too.
    const member = await pageAs('member');
    await visit(member, '/', 'home-signed-in', '[data-test="results"]');
    await expect(
      member.getByRole('button', { name: /^Account menu for / }).isVisible(),
    ).resolves.toBe(true);
    await screenshot(member, 'phone-header-signed-in', { fullPage: false });
  }, 120_000);

  it('a connector sheet, every adapter sheet (diagram stacked) and every write-up fit', async () => {
    const reader = await pageAs('reader');
    await visit(reader, `/documents/${found.connector}`, 'connector-sheet');
    expect(found.adapters.length).toBeGreaterThan(0);
    for (const [k, slug] of found.adapters.entries()) {
      await visit(
        reader,
        `/documents/${slug}`,
        `adapter-sheet-${k + 1}`,
        '[data-test="adapter-diagram"]',
      );
      await expectStackedDiagram(reader, `adapter-sheet-${k + 1}`);
    }
    expect(found.writeups.length).toBeGreaterThan(0);
    for (const [k, slug] of found.writeups.entries()) {
      await visit(reader, `/documents/${slug}`, `writeup-${k + 1}`);
    }
  }, 180_000);

  it('sign-in and register fit', async () => {
    const page = await run.newPage();
    await visit(page, '/sign-in', 'sign-in');
    await visit(page, '/register', 'register');
  }, 60_000);

  it('a member’s account, documents and the editor of each kind fit', async () => {
    const member = await pageAs('member');
    await visit(member, '/account', 'account');
    await visit(member, '/me/documents', 'my-documents');
    await visit(member, '/connectors/new', 'editor-connector-new');
    await visit(member, '/adapters/new', 'editor-adapter-new', '[data-test="circuit-table"]');
    await visit(member, '/writeups/new', 'editor-writeup-new');
    expect(found.edits.map((e) => e.kind)).toEqual(
      expect.arrayContaining(['connector', 'adapter']),
    );
    for (const { kind, id } of found.edits) {
      await visit(member, `/documents/${id}/edit`, `editor-${kind}`);
      if (kind === 'adapter') await expectStackedDiagram(member, `editor-${kind}`);
    }
  }, 180_000);

  it('the review queue and a review fit (moderator)', async () => {
    const moderator = await pageAs('moderator');
    await visit(moderator, '/review', 'review-queue');
    expect(found.reviews.length).toBeGreaterThan(0);
    for (const { kind, revisionId } of found.reviews) {
      await visit(moderator, `/review/${revisionId}`, `review-${kind}`);
    }
  }, 120_000);

  it('the members page fits (admin)', async () => {
    const admin = await pageAs('admin');
    await visit(admin, '/admin/members', 'admin-members');
  }, 60_000);
});
