/** The e-mails about replies: one reply, the daily digest, and a moderator's decision on a reply or document. */
import { serverPurifier } from '../markdown';
import { escapeHtml } from '../http/escape';
import { composeMail, type MailContent } from './templates';

/**
 * Reply HTML (already sanitised for the page) made fit for an e-mail: no images, so
 * opening the mail loads nothing from elsewhere, and the site's own paths made absolute.
 */
export function mailSafeHtml(html: string, publicUrl: string): string {
  const clean = String(
    serverPurifier().sanitize(html, {
      ALLOWED_TAGS: [
        'p',
        'br',
        'hr',
        'h1',
        'h2',
        'h3',
        'h4',
        'blockquote',
        'pre',
        'code',
        'em',
        'strong',
        's',
        'del',
        'ul',
        'ol',
        'li',
        'a',
        'table',
        'thead',
        'tbody',
        'tr',
        'th',
        'td',
      ],
      ALLOWED_ATTR: ['href', 'rel', 'start'],
      ALLOWED_URI_REGEXP: /^(?:https?:\/\/|\/(?!\/)|#)/i,
      RETURN_TRUSTED_TYPE: false,
    }),
  );
  return clean
    .replace(/href="\/(?!\/)/g, `href="${publicUrl}/`)
    .replace(/<(p|ul|ol|pre|blockquote)>/g, '<$1 style="margin:0 0 8px">');
}

export interface ReplyMailInput {
  replier: string;
  documentTitle: string;
  replyText: string;
  replyHtml: string;
  replyUrl: string;
  unsubscribeUrl: string;
  settingsUrl: string;
  /** The recipient wrote the document. */
  isAuthor: boolean;
  /** The reply answers one of the recipient's own replies. */
  answersYou: boolean;
}

/** The e-mail a subscriber gets for one reply. */
export function replyMail(i: ReplyMailInput): MailContent {
  const lead = i.answersYou
    ? `${i.replier} answered your reply under "${i.documentTitle}":`
    : `${i.replier} replied under ${i.isAuthor ? 'your document ' : ''}"${i.documentTitle}":`;
  return composeMail(`${i.replier} replied: ${i.documentTitle}`, {
    paragraphs: [lead],
    quote: { text: i.replyText, html: i.replyHtml },
    action: { label: 'Open the reply', url: i.replyUrl },
    footer: `You get this e-mail because you follow the replies to "${i.documentTitle}" on Loomwright. Wiring work can hurt people and vehicles: follow the vehicle\u2019s service information, local regulations and licensed practice.`,
    footerLinks: [
      { label: 'Stop following this thread (one click)', url: i.unsubscribeUrl },
      { label: 'Choose each reply, a daily digest or no e-mail', url: i.settingsUrl },
    ],
  });
}

export interface DigestEntry {
  documentTitle: string;
  replier: string;
  text: string;
  url: string;
  at: Date;
}

/** One e-mail with a day's replies, grouped by document, each with a link to it. */
export function digestMail(entries: DigestEntry[], unsubscribeUrl: string, settingsUrl: string) {
  const byDoc = new Map<string, DigestEntry[]>();
  for (const e of entries) byDoc.set(e.documentTitle, [...(byDoc.get(e.documentTitle) ?? []), e]);
  const clip = (t: string) => {
    const flat = t.replace(/\s+/g, ' ').trim();
    return flat.length > 300 ? `${flat.slice(0, 299)}…` : flat;
  };
  const text: string[] = [];
  const html: string[] = [];
  for (const [title, list] of byDoc) {
    text.push(`"${title}" (${list.length})`);
    html.push(
      `<p style="margin:8px 0 4px;font-weight:bold">${escapeHtml(title)} (${list.length})</p>`,
    );
    for (const e of list) {
      text.push(`${e.replier} wrote: ${clip(e.text)}\n${e.url}`);
      html.push(
        `<p style="margin:0 0 8px">${escapeHtml(e.replier)} wrote: ${escapeHtml(clip(e.text))} <a href="${escapeHtml(e.url)}" style="color:#8a4a27">Open</a></p>`,
      );
    }
  }
  const n = `${entries.length} new ${entries.length === 1 ? 'reply' : 'replies'}`;
  return composeMail(`Your daily digest: ${n}`, {
    paragraphs: [`${n} in the threads you follow:`],
    quote: { text: text.join('\n\n'), html: html.join('') },
    footer:
      'You get this digest because you chose one daily e-mail for replies on Loomwright. Wiring work can hurt people and vehicles: follow the vehicle\u2019s service information, local regulations and licensed practice.',
    footerLinks: [
      { label: 'Stop reply e-mails (one click)', url: unsubscribeUrl },
      { label: 'Choose each reply, a daily digest or no e-mail', url: settingsUrl },
    ],
  });
}

/** Tells an author a moderator hid their reply. */
export function replyHiddenMail(i: {
  documentTitle: string;
  reason: string;
  moderator: string;
  url: string;
}) {
  return composeMail(`A moderator hid your reply: ${i.documentTitle}`, {
    paragraphs: [
      `${i.moderator} hid your reply under "${i.documentTitle}". Readers now see "hidden by a moderator" in its place.`,
      `The reason given: ${i.reason}`,
      'If you think this is a mistake, reply to the thread or write to the moderators.',
    ],
    action: { label: 'Open the thread', url: i.url },
  });
}

/** Tells an author a moderator took their published document down after a flag. */
export function documentReturnedMail(i: {
  documentTitle: string;
  note: string;
  moderator: string;
  url: string;
}) {
  return composeMail(`Returned after a flag: ${i.documentTitle}`, {
    paragraphs: [
      `A reader flagged "${i.documentTitle}", and ${i.moderator} agreed: it is no longer public and is back with you as a returned revision.`,
      `${i.moderator} wrote: ${i.note}`,
      'Change what the note asks for and submit it again; readers will see it once it is published.',
    ],
    action: { label: 'Open my documents', url: i.url },
  });
}
