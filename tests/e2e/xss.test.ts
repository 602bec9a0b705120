import { beforeAll, describe, expect, it } from 'vitest';
import { Jimp } from 'jimp';
import type { Page } from 'playwright-core';
import { screenshot, useServerAndBrowser } from '../helpers/browser';
import { Session } from '../helpers/crash';

/**
 * Payload families of the OWASP XSS filter evasion cheat sheet. Each one calls
 * `xssFired(n)` if it ever runs; the page defines nothing of the kind, so any call shows
 * up as a page error or a dialog, and every attempt to run is recorded.
 */
const PAYLOADS = [
  `<script>alert('XSS1')</script>`,
  `<img src=x onerror="alert('XSS2')">`,
  `<svg onload=alert('XSS3')>`,
  `<svg><script>alert('XSS4')</script></svg>`,
  `<a href="javascript:alert('XSS5')">link</a>`,
  `<a href="jav&#x09;ascript:alert('XSS6')">tab</a>`,
  `<a href="&#106;&#97;&#118;&#97;&#115;&#99;&#114;&#105;&#112;&#116;&#58;alert('XSS7')">entities</a>`,
  `[md link](javascript:alert('XSS8'))`,
  `[md data](data:text/html;base64,PHNjcmlwdD5hbGVydCgnWFNTOScpPC9zY3JpcHQ+)`,
  `![md img](javascript:alert('XSS10'))`,
  `<iframe src="javascript:alert('XSS11')"></iframe>`,
  `<iframe srcdoc="<script>alert('XSS12')</script>"></iframe>`,
  `<div style="background-image:url(javascript:alert('XSS13'))">css</div>`,
  `<style>@import 'javascript:alert("XSS14")';</style>`,
  `<meta http-equiv="refresh" content="0;url=javascript:alert('XSS15')">`,
  `<<SCRIPT>alert('XSS16');//<</SCRIPT>`,
  `<IMG """><SCRIPT>alert('XSS17')</SCRIPT>">`,
  `"><script>alert('XSS18')</script>`,
  `'><img src=x onerror=alert('XSS19')>`,
  `<math><mtext><table><mglyph><style><img src=x onerror=alert('XSS20')></style></mglyph></table></mtext></math>`,
  `<details open ontoggle=alert('XSS21')>`,
  `<body onload=alert('XSS22')>`,
  `<object data="javascript:alert('XSS23')"></object>`,
  `<embed src="data:text/html,<script>alert('XSS24')</script>">`,
  `<form><button formaction="javascript:alert('XSS25')">go</button></form>`,
];
const ALL = PAYLOADS.join(' \n');
const SHORT = [
  `<svg onload=alert(31)>`,
  `<img src=x onerror=alert(32)>`,
  `"><script>alert(33)</script>`,
  `<b onclick=alert(34)>x</b>`,
];
/** A payload that fits a field of at most `max` characters (the i-th that does). */
const fit = (i: number, max = 150) => {
  const fitting = [...PAYLOADS, ...SHORT].filter((p) => p.length <= max);
  return fitting[i % fitting.length];
};
const short = (i: number) => fit(i, 150);

const run = useServerAndBrowser();
const pagesToOpen: string[] = [];

async function png(): Promise<Buffer> {
  const img = new Jimp({ width: 64, height: 48, color: 0x3a3f45ff });
  return img.getBuffer('image/png');
}

beforeAll(async () => {
  const member = new Session(run.url);
  await member.signIn('member@example.test');
  const moderator = new Session(run.url);
  await moderator.signIn('moderator@example.test');

  // A display name that is itself a payload.
  expect(
    (
      await member.call('PATCH', '/api/auth/me', {
        displayName: `Rook "><img src=x onerror=alert(1)>`,
      })
    ).status,
  ).toBe(200);

  const connector = await member.call('POST', '/api/documents', {
    kind: 'connector',
    title: `Sheet ${short(1)}`,
    content: {
      cavityCount: 3,
      layout: { rows: 1, cols: 3 },
      housing: 'socket',
      view: 'wire-side',
      sealed: true,
      component: short(2),
      tags: [short(3), short(18)],
      summary: short(4),
      notes: ALL.slice(0, 4000),
      pins: [
        {
          cavity: '1',
          role: short(0),
          color: fit(0, 24),
          size: '20 AWG',
          circuit: fit(1, 32),
          note: short(7),
        },
        {
          cavity: '2',
          role: 'signal',
          color: 'GN/YE',
          size: '20 AWG',
          circuit: '',
          note: short(19),
        },
        { cavity: '3', role: 'ground', color: 'BK', size: '20 AWG', circuit: '', note: short(16) },
      ],
    },
  });
  expect(connector.status, JSON.stringify(connector.body).slice(0, 400)).toBe(201);

  const adapter = await member.call('POST', '/api/documents', {
    kind: 'adapter',
    title: `Adapter ${short(17)}`,
    content: {
      systemVoltage: 12,
      ends: {
        A: { label: short(1), cavityCount: 2, sealed: false },
        B: { label: short(2), cavityCount: 2, sealed: false },
      },
      circuits: [
        { a: ['1'], b: ['1'], role: short(3), size: '20 AWG', color: 'RD', note: short(4) },
        { a: ['2'], b: ['2'], role: 'ground', size: '20 AWG', color: 'BK', note: short(5) },
      ],
    },
  });
  expect(adapter.status, JSON.stringify(adapter.body).slice(0, 400)).toBe(201);

  const form = new FormData();
  form.append(
    'file',
    new Blob([new Uint8Array(await png())], { type: 'image/png' }),
    `<img src=x onerror=alert('XSS-file')>.png`,
  );
  const upload = await member.call('POST', '/api/uploads', form);
  expect(upload.status, JSON.stringify(upload.body).slice(0, 400)).toBe(201);

  const writeup = await member.call('POST', '/api/documents', {
    kind: 'writeup',
    title: `Write-up ${short(0)}`,
    content: {
      summary: short(1),
      body: `# Moving the sensor\n\n${ALL}\n\n![${short(2)}](image:1)\n`,
      images: [{ uploadId: upload.body.id, caption: short(19), annotations: [] }],
    },
  });
  expect(writeup.status, JSON.stringify(writeup.body).slice(0, 400)).toBe(201);

  for (const doc of [connector, adapter, writeup]) {
    const sub = await member.call('POST', `/api/documents/${doc.body.id}/submit`);
    expect(sub.status, JSON.stringify(sub.body).slice(0, 300)).toBe(200);
    pagesToOpen.push(`/review/${sub.body.revision.id}`);
  }
  // Let the moderator look before publishing, then publish all three.
  pagesToOpen.push('/review', '/me/documents');
  for (const p of pagesToOpen.filter((u) => /^\/review\/\d+$/.test(u))) {
    const id = p.split('/').pop();
    const pub = await moderator.call('POST', `/api/review/${id}/publish`, { note: short(18) });
    expect(pub.status).toBe(200);
  }
  for (const doc of [connector, adapter, writeup]) {
    pagesToOpen.push(`/documents/${doc.body.slug}`);
    const reply = await member.call('POST', `/api/documents/${doc.body.id}/replies`, {
      body: ALL.slice(0, 3000),
    });
    expect(reply.status, JSON.stringify(reply.body).slice(0, 400)).toBe(201);
  }
  pagesToOpen.push(
    `/search?q=${encodeURIComponent('Sheet')}`,
    '/',
    '/admin/members',
    '/admin/audit',
    '/dev/mail',
    '/writeups',
  );
}, 240_000);

async function visit(page: Page, path: string, events: string[]) {
  await page.goto(`${run.url}${path}`, { waitUntil: 'networkidle' });
  await page.waitForTimeout(300);
  // Nothing a payload could have injected may be live in the page.
  const live = await page.evaluate(() => {
    const found: string[] = [];
    for (const el of document.querySelectorAll('*')) {
      for (const attr of el.attributes) {
        if (/^on/i.test(attr.name)) found.push(`${el.tagName}[${attr.name}]`);
        if (
          ['href', 'src', 'action', 'formaction', 'data'].includes(attr.name) &&
          /^\s*(javascript|data:text)/i.test(attr.value)
        )
          found.push(`${el.tagName}[${attr.name}=${attr.value.slice(0, 40)}]`);
      }
    }
    for (const s of document.querySelectorAll('script'))
      if (/alert/.test(s.textContent ?? '')) found.push('inline <script>');
    return found;
  });
  events.push(...live.map((l) => `${path}: live ${l}`));
}

describe('hostile text in every field a person can type', () => {
  it('runs no script on any page that shows it, for a reader, the author, a moderator and an admin', async () => {
    const events: string[] = [];
    for (const who of ['reader', 'member', 'moderator', 'admin'] as const) {
      const context = await run.browser.newContext();
      const page = await context.newPage();
      page.on('dialog', (d) => {
        events.push(`${who}: dialog "${d.message()}" on ${page.url()}`);
        void d.dismiss();
      });
      page.on('pageerror', (e) => {
        if (/alert|XSS/.test(e.message)) events.push(`${who}: script ran: ${e.message}`);
      });
      page.on('console', (m) => {
        if (/XSS\d/.test(m.text()) && !/Content Security Policy/.test(m.text()))
          events.push(`${who}: console ${m.text()}`);
      });
      if (who !== 'reader') {
        await page.goto(`${run.url}/sign-in`);
        await page
          .getByLabel('E-mail')
          .waitFor({ timeout: 15_000 })
          .catch(async (e) => {
            await screenshot(page, `xss-signin-${who}`);
            throw e;
          });
        await page.getByLabel('E-mail').fill(`${who === 'member' ? 'member' : who}@example.test`);
        await page
          .getByLabel('Password', { exact: true })
          .fill(process.env.DEMO_PASSWORD ?? 'harness-test-pass-91');
        await page.getByRole('button', { name: 'Sign in' }).click();
        await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
      }
      // Readers see what is public; the admin's own pages are theirs alone.
      const paths = pagesToOpen.filter((p) =>
        who === 'admin'
          ? true
          : who === 'reader'
            ? !/^\/(review|me|admin)/.test(p)
            : !p.startsWith('/admin'),
      );
      for (const path of paths) await visit(page, path, events);
      if (who === 'moderator') await screenshot(page, 'xss-last-page-moderator');
      await context.close();
    }
    expect(events).toEqual([]);
  }, 300_000);
});
