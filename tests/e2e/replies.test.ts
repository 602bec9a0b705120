import { describe, expect, it } from 'vitest';
import { screenshot, useServerAndBrowser } from '../helpers/browser';
import { DEMO_CONNECTOR_SLUGS } from '../../server/seed/connectors';

const run = useServerAndBrowser();

const A = { email: 'member@example.test', name: 'Rook Vantler' };
const B = { email: 'member2@example.test', name: 'Juniper Okonye' };
const SLUG = DEMO_CONNECTOR_SLUGS.coolingFan;

/** Mail the local fake caught for `to` about replies (the API flushes the outbox first). */
async function replyMailFor(to: string) {
  const res = await fetch(`${run.url}/api/dev/mail`);
  const all = (await res.json()) as Array<{ to: string; subject: string; text: string }>;
  return all.filter((m) => m.to.includes(to) && / replied: /.test(m.subject));
}

describe('replies in the browser', () => {
  it('A asks, B answers, A follows the e-mail to the reply, marks it, unsubscribes; B replies again and A gets nothing', async () => {
    const a = await run.signedInPage(A.email);
    await a.goto(`${run.url}/documents/${SLUG}`);
    await a.getByRole('heading', { name: 'Questions and replies' }).waitFor();
    await a.getByRole('button', { name: 'Following replies' }).waitFor();
    const question =
      'Has anyone measured the fan current at full speed? I want to size the new **relay**.';
    await a.getByLabel('Your reply').fill(question);
    await a.getByRole('tab', { name: 'Preview' }).click();
    await a.locator('.lw-composer__preview strong', { hasText: 'relay' }).waitFor();
    await a.getByRole('tab', { name: 'Write' }).click();
    await a.getByRole('button', { name: 'Post reply' }).click();
    const asked = a.locator('article.lw-reply', { hasText: 'Has anyone measured the fan current' });
    await asked.waitFor();
    await screenshot(a, 'replies-1-question');

    const b = await run.signedInPage(B.email);
    await b.goto(`${run.url}/documents/${SLUG}`);
    const theirs = b.locator('article.lw-reply', {
      hasText: 'Has anyone measured the fan current',
    });
    await theirs.getByRole('button', { name: 'Reply' }).click();
    await b
      .getByLabel(`Reply to ${A.name}`)
      .fill('About 28 A at full speed on mine, so a 40 A relay with a 40 A fuse.');
    await b.getByRole('button', { name: 'Post reply' }).first().click();
    const answer = b.locator('article.lw-reply', { hasText: 'About 28 A at full speed' });
    await answer.waitFor();
    await screenshot(b, 'replies-2-answer');

    // A's mailbox (the local fake) has the e-mail; its link opens the reply.
    let mails: Awaited<ReturnType<typeof replyMailFor>> = [];
    for (let i = 0; i < 40 && !mails.length; i++) {
      mails = await replyMailFor(A.email);
      if (!mails.length) await new Promise((r) => setTimeout(r, 250));
    }
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toContain(B.name);
    expect(mails[0].text).toContain('About 28 A at full speed');

    await a.goto(`${run.url}/dev/mail`);
    await a.getByText(`${B.name} replied:`).first().click();
    const link = a.locator('.lw-mailbox__text a[href*="#reply-"]').first();
    await link.waitFor();
    await screenshot(a, 'replies-3-mailbox');
    const href = (await link.getAttribute('href'))!;
    const replyId = /#reply-(\d+)/.exec(href)![1];
    await link.click();
    const target = a.locator(`#reply-${replyId}`);
    await target.waitFor();
    expect(a.url()).toContain(`/documents/${SLUG}#reply-${replyId}`);
    await expect.poll(() => target.getAttribute('class')).toContain('lw-reply--highlight');
    expect(await target.textContent()).toContain('About 28 A at full speed');
    await expect
      .poll(
        () =>
          target.evaluate((el) => {
            const r = el.getBoundingClientRect();
            return r.top >= 0 && r.bottom <= window.innerHeight;
          }),
        { timeout: 5000 },
      )
      .toBe(true);
    await screenshot(a, 'replies-4-followed-link');

    await target.getByRole('button', { name: 'Mark as the answer' }).click();
    await a.locator(`#reply-${replyId} .lw-reply__answer`).waitFor();
    await a.getByText(`Answered by ${B.name}`).waitFor();
    await screenshot(a, 'replies-5-answer-marked');

    // The unsubscribe link in the same e-mail, without needing the session.
    await a.goto(`${run.url}/dev/mail`);
    await a.getByText(`${B.name} replied:`).first().click();
    const stop = a.locator('.lw-mailbox__text a[href*="/unsubscribe?token="]').first();
    await stop.waitFor();
    await stop.click();
    await a.getByRole('button', { name: 'Unsubscribe' }).waitFor();
    await screenshot(a, 'replies-6-unsubscribe-confirm');
    await a.getByRole('button', { name: 'Unsubscribe' }).click();
    await a.getByText(/You no longer follow the replies to/).waitFor();
    await screenshot(a, 'replies-7-unsubscribed');

    await b.reload();
    await b
      .getByLabel('Your reply')
      .fill('One more thing: route the new feed away from the exhaust manifold.');
    await b.getByRole('button', { name: 'Post reply' }).click();
    await b.locator('article.lw-reply', { hasText: 'One more thing' }).waitFor();
    await new Promise((r) => setTimeout(r, 1500));
    expect(await replyMailFor(A.email)).toHaveLength(1);

    // The bell still tells A in the app.
    await a.goto(`${run.url}/documents/${SLUG}`);
    await a.getByRole('button', { name: /Notifications, \d+ unread/ }).click();
    await a.getByText(`${B.name} replied:`).first().waitFor();
    await screenshot(a, 'replies-8-bell');
    await a.keyboard.press('Escape');
    await a.getByRole('button', { name: 'Notifications', exact: true }).waitFor();
    await a.getByRole('button', { name: 'Follow replies' }).waitFor();

    await a.context().close();
    await b.context().close();
  }, 120_000);

  it('a flag reaches the moderators, who hide the reply; members choose their e-mail; admins see the outbox', async () => {
    const coolant = DEMO_CONNECTOR_SLUGS.coolantSensor;
    const b = await run.signedInPage(B.email);
    await b.goto(`${run.url}/documents/${coolant}`);
    const target = b.locator('article.lw-reply', {
      hasText: 'Thank you for printing the view side',
    });
    await target.getByRole('button', { name: 'Flag' }).click();
    await b.getByRole('radio', { name: 'Spam or abuse' }).click();
    await b.getByLabel(/Note for the moderator/).fill('Looks like an advert to me.');
    await screenshot(b, 'replies-flag-dialog');
    await b.getByRole('button', { name: 'Send the flag' }).click();
    await b.getByText('The flag is in the moderators’ queue').waitFor();

    const mod = await run.signedInPage('moderator@example.test');
    await mod.goto(`${run.url}/review/flags`);
    const item = mod.locator('li.lw-flag', { hasText: 'Looks like an advert to me.' });
    await item.waitFor();
    await screenshot(mod, 'replies-flag-queue');
    await item.getByRole('button', { name: 'Hide the reply' }).click();
    await mod
      .getByLabel('Note for the author (required)')
      .fill('Not an advert after all, but off topic: hidden to keep the thread on the plug.');
    await mod.getByRole('button', { name: 'Reply hidden' }).click();
    await mod.getByText('No open flags').waitFor();

    await mod.goto(`${run.url}/documents/${coolant}`);
    const modView = mod.locator('article.lw-reply', { hasText: 'hidden by a moderator' });
    await modView.getByText('Thank you for printing the view side').waitFor();
    await modView.getByRole('button', { name: 'Show again' }).waitFor();
    await screenshot(mod, 'replies-moderator-hidden');

    const reader = await run.browser.newPage();
    await reader.goto(`${run.url}/documents/${coolant}`);
    await reader.getByText('hidden by a moderator').waitFor();
    expect(await reader.getByText('Thank you for printing the view side').count()).toBe(0);
    await reader.getByText('Sign in').last().waitFor();
    await screenshot(reader, 'replies-reader');
    await reader.setViewportSize({ width: 390, height: 844 });
    await reader.goto(`${run.url}/documents/${coolant}#reply-1`);
    await reader.locator('#reply-1.lw-reply--highlight').waitFor();
    await screenshot(reader, 'replies-reader-phone');
    await reader.close();

    const a = await run.signedInPage(A.email);
    await a.goto(`${run.url}/account/notifications`);
    await a.getByRole('radio', { name: /daily digest/ }).click();
    await a.getByText('Saved.').waitFor();
    await screenshot(a, 'replies-settings');

    const admin = await run.signedInPage('admin@example.test');
    await admin.goto(`${run.url}/admin/mail?status=sent`);
    await admin.locator('td', { hasText: 'replied:' }).first().waitFor();
    await screenshot(admin, 'replies-admin-mail');

    for (const p of [a, b, mod, admin]) await p.context().close();
  }, 120_000);
});
