// @vitest-environment jsdom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import { createMemoryHistory, createRouter } from 'vue-router';
import RevisionHistory from '@/components/documents/RevisionHistory.vue';
import { configureApiClient, resetApiClient, setCsrfToken } from '@/api/client';
import { STATUS_LABELS, submitDocument, type RevisionSummary } from '@/api/documents';

function json(status: number, body: unknown): Response {
  return new Response(JSON.stringify(body), {
    status,
    headers: { 'content-type': 'application/json' },
  });
}

function installFetch(handler: (url: string, init: RequestInit) => Response) {
  const calls: Array<{ url: string; init: RequestInit }> = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
      calls.push({ url: String(input), init });
      return handler(String(input), init);
    }),
  );
  return calls;
}

const moderator = { id: 9, displayName: 'Ilse Marrow' };
const REVISIONS: RevisionSummary[] = [
  {
    id: 33,
    number: 3,
    status: 'submitted',
    version: 6,
    title: 'Coolant sensor plug (3-way)',
    note: null,
    reviewer: null,
    submittedAt: '2026-03-05T10:00:00.000Z',
    decidedAt: null,
    publishedAt: null,
    updatedAt: '2026-03-05T10:00:00.000Z',
  },
  {
    id: 32,
    number: 2,
    status: 'returned',
    version: 4,
    title: 'Coolant sensor plug',
    note: 'Say which side the drawing is seen from.',
    reviewer: moderator,
    submittedAt: '2026-03-03T09:00:00.000Z',
    decidedAt: '2026-03-04T09:30:00.000Z',
    publishedAt: null,
    updatedAt: '2026-03-04T09:30:00.000Z',
  },
  {
    id: 31,
    number: 1,
    status: 'superseded',
    version: 2,
    title: 'Coolant sensor plug',
    note: null,
    reviewer: moderator,
    submittedAt: '2026-03-01T08:00:00.000Z',
    decidedAt: '2026-03-02T08:00:00.000Z',
    publishedAt: '2026-03-02T08:00:00.000Z',
    updatedAt: '2026-03-02T08:00:00.000Z',
  },
];

function router() {
  return createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/', component: { template: '<div />' } },
      { path: '/documents/:slug', name: 'document', component: { template: '<div />' } },
    ],
  });
}

async function mountHistory(props: Record<string, unknown>) {
  const r = router();
  await r.push('/');
  const wrapper = mount(RevisionHistory, {
    props: { documentId: 7, slug: 'coolant-sensor-plug', ...props },
    global: { plugins: [[Quasar, {}], r] as never },
  });
  await flushPromises();
  return wrapper;
}

beforeEach(() => {
  resetApiClient();
  configureApiClient({ notify: vi.fn(), onUnauthenticated: vi.fn() });
  setCsrfToken('token');
});
afterEach(() => vi.unstubAllGlobals());

describe('RevisionHistory', () => {
  it('lists every revision newest first with its status word, dates, reviewer and note', async () => {
    const calls = installFetch(() => json(200, REVISIONS));
    const wrapper = await mountHistory({});
    expect(calls.map((c) => c.url)).toEqual(['/api/documents/7/revisions']);
    const items = wrapper.findAll('li[data-revision]');
    expect(items.map((li) => li.attributes('data-revision'))).toEqual(['3', '2', '1']);
    expect(items.map((li) => li.get('[data-status]').attributes('data-status'))).toEqual([
      'submitted',
      'returned',
      'superseded',
    ]);
    expect(items[0].text()).toContain(`Revision 3`);
    expect(items[0].text()).toContain(STATUS_LABELS.submitted);
    expect(items[0].text()).toContain('Submitted');
    expect(items[1].text()).toMatch(/Returned .* by Ilse Marrow/);
    expect(items[1].get('blockquote').text()).toBe(
      'Note from Ilse Marrow: Say which side the drawing is seen from.',
    );
    expect(items[2].text()).toMatch(/Published .* by Ilse Marrow; replaced by a later revision/);
    expect(items[2].find('blockquote').exists()).toBe(false);
  });

  it('links each revision to its page with ?revision=N, and marks the current one instead', async () => {
    installFetch(() => json(200, REVISIONS));
    const wrapper = await mountHistory({ current: 3, currentLabel: 'under review' });
    const links = wrapper.findAll('a[data-test="view-revision"]');
    expect(links.map((a) => a.attributes('href'))).toEqual([
      '/documents/coolant-sensor-plug?revision=2',
      '/documents/coolant-sensor-plug?revision=1',
    ]);
    expect(links[0].attributes('aria-label')).toBe('View revision 2 (returned)');
    const current = wrapper.get('li[aria-current="true"]');
    expect(current.attributes('data-revision')).toBe('3');
    expect(current.text()).toContain('under review');
    expect(current.find('a').exists()).toBe(false);
  });

  it('says so in place when the revisions cannot be read', async () => {
    installFetch(() =>
      json(403, {
        error: {
          code: 'FORBIDDEN',
          message: 'Only the author and moderators can see the revisions of a document.',
        },
      }),
    );
    const wrapper = await mountHistory({});
    expect(wrapper.get('[role="alert"]').text()).toContain(
      'Only the author and moderators can see the revisions of a document.',
    );
    expect(wrapper.findAll('li')).toHaveLength(0);
  });

  it('has a labelled heading at the level asked for', async () => {
    installFetch(() => json(200, []));
    const wrapper = await mountHistory({ headingLevel: 3 });
    const heading = wrapper.get('h3');
    // The icon's ligature is hidden from screen readers; the words are the name.
    expect(heading.text()).toMatch(/Revision history$/);
    expect(heading.get('.q-icon').attributes('aria-hidden')).toBe('true');
    expect(wrapper.get('section').attributes('aria-labelledby')).toBe(heading.attributes('id'));
    expect(wrapper.text()).toContain('No revisions yet.');
  });
});

describe('submitDocument', () => {
  it('sends the version the editor last saved, and an empty body without one', async () => {
    const calls = installFetch(() => json(200, { revision: { id: 1, status: 'submitted' } }));
    await submitDocument(7, { version: 5 });
    await submitDocument(8);
    expect(calls.map((c) => [c.url, c.init.method, c.init.body])).toEqual([
      ['/api/documents/7/submit', 'POST', JSON.stringify({ version: 5 })],
      ['/api/documents/8/submit', 'POST', JSON.stringify({})],
    ]);
  });
});
