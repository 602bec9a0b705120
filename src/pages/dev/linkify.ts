/**
 * Splits a plain-text e-mail into text and links. Only links to this site become
 * clickable (as in-app paths): the mailbox must not be a way to open arbitrary hosts.
 */
export type MailSegment =
  { kind: 'text'; text: string } | { kind: 'link'; text: string; path: string };

const URL_PATTERN = /https?:\/\/[^\s<>"'()[\]]+/g;
const TRAILING = /[.,;:!?]+$/;

export function linkifyMailText(text: string, origin: string): MailSegment[] {
  const segments: MailSegment[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    const raw = match[0].replace(TRAILING, '');
    const start = match.index ?? 0;
    const url = URL.canParse(raw) ? new URL(raw) : null;
    if (!url || url.origin !== origin) continue;
    if (start > last) segments.push({ kind: 'text', text: text.slice(last, start) });
    segments.push({ kind: 'link', text: raw, path: url.pathname + url.search + url.hash });
    last = start + raw.length;
  }
  if (last < text.length) segments.push({ kind: 'text', text: text.slice(last) });
  return segments;
}
