import type { MailMessage } from './mailer';
import escapeHtml from 'escape-html';

export interface EmailContent {
  to: string;
  subject: string;
  heading: string;
  paragraphs: string[];
  action?: { label: string; url: string };
  footnote?: string;
}

/** Every e-mail has a plain-text part and an HTML part built from the same words. */
export function renderEmail(c: EmailContent): MailMessage {
  const text = [c.heading, '', ...c.paragraphs.flatMap((p) => [p, '']), ...(c.action ? [`${c.action.label}: ${c.action.url}`, ''] : []), ...(c.footnote ? [c.footnote, ''] : []), '— Ridgeload'].join('\n');
  const html = `<!doctype html><html><body style="margin:0;background:#f4f1ea;font-family:'Work Sans',Arial,sans-serif;color:#1f2a33">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0"><tr><td align="center" style="padding:24px">
<table role="presentation" width="560" cellpadding="0" cellspacing="0" style="background:#ffffff;border-radius:8px;border-top:6px solid #b4532a">
<tr><td style="padding:24px 28px">
<p style="margin:0 0 4px;font-size:13px;letter-spacing:.08em;text-transform:uppercase;color:#5b6b78">Ridgeload</p>
<h1 style="margin:0 0 16px;font-size:22px">${escapeHtml(c.heading)}</h1>
${c.paragraphs.map((p) => `<p style="margin:0 0 12px;font-size:15px;line-height:1.5">${escapeHtml(p)}</p>`).join('\n')}
${
  c.action
    ? `<p style="margin:20px 0"><a href="${escapeHtml(c.action.url)}" style="background:#1f3b4d;color:#ffffff;padding:12px 18px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(c.action.label)}</a></p>
<p style="margin:0 0 12px;font-size:12px;color:#5b6b78">Or open this address: ${escapeHtml(c.action.url)}</p>`
    : ''
}
${c.footnote ? `<p style="margin:16px 0 0;font-size:12px;color:#5b6b78">${escapeHtml(c.footnote)}</p>` : ''}
</td></tr></table></td></tr></table></body></html>`;
  return { to: c.to, subject: c.subject, text, html };
}
