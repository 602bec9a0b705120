import { escapeHtml } from '../http/escape';

export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

interface Block {
  /** Plain paragraph text; escaped for the HTML part. */
  paragraphs: string[];
  action?: { label: string; url: string };
  /**
   * Quoted content after the paragraphs: `text` for the plain part and `html` for the
   * HTML part. The html must already be sanitised (e.g. with mailSafeHtml in replyMail.ts).
   */
  quote?: { text: string; html: string };
  footer?: string;
  /** Links under the footer, such as "Stop these e-mails". */
  footerLinks?: Array<{ label: string; url: string }>;
}

/**
 * Builds a message with a plain-text part and a simple HTML part from the same words,
 * so both say the same thing and nothing unescaped reaches the HTML.
 */
export function composeMail(subject: string, block: Block): MailContent {
  const footer =
    block.footer ??
    'You get this e-mail because of your account on Loomwright. Wiring work can hurt people and vehicles: follow the vehicle\u2019s service information, local regulations and licensed practice.';
  const textParts = [...block.paragraphs];
  if (block.quote) textParts.push(block.quote.text.trim());
  if (block.action) textParts.push(`${block.action.label}: ${block.action.url}`);
  textParts.push('--', footer);
  for (const link of block.footerLinks ?? []) textParts.push(`${link.label}: ${link.url}`);
  const text = textParts.join('\n\n') + '\n';

  const p = (s: string) => `<p style="margin:0 0 12px">${escapeHtml(s).replace(/\n/g, '<br>')}</p>`;
  const button = block.action
    ? `<p style="margin:16px 0"><a href="${escapeHtml(block.action.url)}" style="background:#b4693e;color:#ffffff;padding:10px 16px;border-radius:4px;text-decoration:none">${escapeHtml(block.action.label)}</a></p><p style="margin:0 0 12px;font-size:12px;color:#555">Or paste this address into your browser: ${escapeHtml(block.action.url)}</p>`
    : '';
  const quote = block.quote
    ? `<div style="margin:0 0 12px;padding:8px 12px;border-left:3px solid #b4693e;background:#f5f3ee">${block.quote.html}</div>`
    : '';
  const footerLinks = (block.footerLinks ?? [])
    .map(
      (l) =>
        `<p style="font-size:12px;color:#555;margin:8px 0 0"><a href="${escapeHtml(l.url)}" style="color:#8a4a27">${escapeHtml(l.label)}</a></p>`,
    )
    .join('');
  const html = `<!doctype html><html><body style="font-family:Roboto,Arial,sans-serif;background:#f5f3ee;color:#2a2e33;padding:16px"><div style="max-width:560px;margin:0 auto;background:#ffffff;padding:20px;border-top:4px solid #b4693e"><h1 style="font-size:18px;margin:0 0 16px">${escapeHtml(subject)}</h1>${block.paragraphs.map(p).join('')}${quote}${button}<hr style="border:none;border-top:1px solid #ddd;margin:16px 0"><p style="font-size:12px;color:#555;margin:0">${escapeHtml(footer)}</p>${footerLinks}</div></body></html>`;
  return { subject, text, html };
}
