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

/**
 * The reading tables and the pin map neither scroll sideways inside their boxes nor stick
 * out of them: the page fitting is not enough, as a table in a scroller fits the page
 * while its last columns are out of sight. Then the pin map: every cavity label and code
 * inside the drawing and drawn at 10 px or more. Shoots each table and the pin map.
 */
async function expectReadingFits(page: Page, shot: string) {
  const found = await page.evaluate(() => {
    const main = document.querySelector('main')!;
    const name = (el: Element) =>
      `${el.tagName.toLowerCase()}.${[...el.classList].slice(0, 2).join('.')}${
        el.getAttribute('data-test') ? `[data-test=${el.getAttribute('data-test')}]` : ''
      }`;
    const scrolls: string[] = [];
    for (const el of main.querySelectorAll<HTMLElement>('*')) {
      const ox = getComputedStyle(el).overflowX;
      if ((ox === 'auto' || ox === 'scroll') && el.clientWidth > 1) {
        if (el.scrollWidth > el.clientWidth + 1)
          scrolls.push(`${name(el)} ${el.scrollWidth}/${el.clientWidth} px`);
      }
    }
    const wide: string[] = [];
    const tables = [...main.querySelectorAll<HTMLElement>('table')].filter(
      (t) => t.getBoundingClientRect().width > 0,
    );
    for (const t of tables) {
      const box = t.parentElement!.getBoundingClientRect();
      const own = t.getBoundingClientRect();
      if (own.right > box.right + 1 || own.left < box.left - 1)
        wide.push(`${name(t)} ${Math.round(own.width)}/${Math.round(box.width)} px`);
    }
    const maps = [...main.querySelectorAll<SVGSVGElement>('figure.lw-pinmap svg.lw-pinmap__svg')]
      .filter((svg) => !svg.closest('.lw-pinmap--compact'))
      .map((svg) => {
        const box = svg.getBoundingClientRect();
        const scale = box.width / svg.viewBox.baseVal.width;
        const texts = [...svg.querySelectorAll<SVGTextElement>('text')];
        const outside = texts
          .filter((t) => {
            const r = t.getBoundingClientRect();
            return r.left < box.left - 1 || r.right > box.right + 1;
          })
          .map((t) => t.textContent!.trim());
        const small = [
          ...svg.querySelectorAll<SVGTextElement>('text.lw-pinmap__label, text.lw-pinmap__code'),
        ]
          .map((t) => ({
            text: t.textContent!.trim(),
            px: parseFloat(getComputedStyle(t).fontSize) * scale,
          }))
          .filter((t) => t.px < 10 - 0.01)
          .map((t) => `${t.text} ${t.px.toFixed(1)} px`);
        return {
          mode: svg.getAttribute('data-mode'),
          view: svg.querySelector('text.lw-pinmap__viewtext')?.textContent?.trim() ?? '',
          cavities: svg.querySelectorAll('g.lw-pinmap__cavity').length,
          swatches: svg.querySelectorAll('g.lw-pinmap__wire').length,
          codes: svg.querySelectorAll('g.lw-pinmap__wire text.lw-pinmap__code').length,
          outside,
          small,
        };
      });
    return { scrolls, wide, tables: tables.length, maps };
  });
  expect(found.scrolls, `${shot}: boxes that scroll sideways`).toEqual([]);
  expect(found.wide, `${shot}: tables wider than their box`).toEqual([]);
  for (const map of found.maps) {
    expect(map.view, `${shot}: the pin map names its view side`).toMatch(/^Viewed from: /);
    expect(map.codes, `${shot}: a printed code beside every swatch`).toBe(map.swatches);
    expect(map.outside, `${shot}: pin map text outside the drawing`).toEqual([]);
    expect(map.small, `${shot}: pin map text under 10 px`).toEqual([]);
  }
  // A window as tall as each part, so the fixed header does not cover it in the shot.
  const parts = [
    ['figure.lw-pinmap:not(.lw-pinmap--compact)', 'pinmap'],
    ['[data-test="pin-table"]', 'pin-table'],
    ['[data-test="adapter-table"]', 'adapter-table'],
    ['section.lw-cut', 'cut-list'],
    ['[data-test="parts-list"]', 'parts-list'],
    ['[data-test="wire-run"]', 'wire-run'],
  ] as const;
  for (const [selector, part] of parts) {
    const el = page.locator(selector).first();
    if (!(await el.count())) continue;
    const height = await el.evaluate((e) => e.getBoundingClientRect().height);
    await page.setViewportSize({ width: PHONE.width, height: Math.ceil(height) + 160 });
    await el.evaluate((e) => e.scrollIntoView({ block: 'center' }));
    await elementShot(page, selector, `phone-${shot}-${part}`);
  }
  await page.setViewportSize(PHONE);
  return found;
}

interface Found {
  connector: string;
  /** The connector with the most cavities: the widest pin map. */
  widestConnector: string;
  adapters: string[];
  writeups: string[];
  /** The member's own documents to edit, one of each kind they have. */
  edits: Array<{ kind: string; id: number }>;
  /** One review per kind in the queue. */
  reviews: Array<{ kind: string; revisionId: number }>;
}
const found: Found = {
  connector: '',
  widestConnector: '',
  adapters: [],
  writeups: [],
  edits: [],
  reviews: [],
};
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
  const widest = await getJson<{ items: Array<{ slug: string; cavityCount: number }> }>(
    reader,
    '/api/search?kind=connector&limit=100',
  );
  found.widestConnector = widest.items.reduce((a, b) =>
    b.cavityCount > a.cavityCount ? b : a,
  ).slug;
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
    await expectReadingFits(reader, 'connector-sheet');
    await visit(reader, `/documents/${found.widestConnector}`, 'connector-sheet-widest');
    const widest = await expectReadingFits(reader, 'connector-sheet-widest');
    expect(
      widest.maps.map((m) => m.mode),
      'the wide pin map is pitched to the phone',
    ).toEqual(['narrow']);
    expect(widest.tables, 'the pinout table').toBeGreaterThan(0);
    // On paper the pin map is the natural drawing again, whatever the screen was.
    await reader.emulateMedia({ media: 'print' });
    await expect
      .poll(() => reader.locator('svg.lw-pinmap__svg').first().getAttribute('data-mode'))
      .toBe('natural');
    await reader.emulateMedia({ media: 'screen' });
    expect(found.adapters.length).toBeGreaterThan(0);
    for (const [k, slug] of found.adapters.entries()) {
      await visit(
        reader,
        `/documents/${slug}`,
        `adapter-sheet-${k + 1}`,
        '[data-test="adapter-diagram"]',
      );
      await expectStackedDiagram(reader, `adapter-sheet-${k + 1}`);
      await expectReadingFits(reader, `adapter-sheet-${k + 1}`);
    }
    expect(found.writeups.length).toBeGreaterThan(0);
    for (const [k, slug] of found.writeups.entries()) {
      await visit(reader, `/documents/${slug}`, `writeup-${k + 1}`);
      await expectReadingFits(reader, `writeup-${k + 1}`);
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
