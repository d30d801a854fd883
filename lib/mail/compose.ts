// The one layout every mail shares: a greeting, paragraphs, an optional button-like link, and the footer that says
// why the mail was sent and how to stop such mails. Text and HTML parts carry the same words; everything that
// came from people (names, titles) is escaped in the HTML part.

export interface MailContent {
  subject: string;
  /** Plain-text paragraphs. */
  paragraphs: string[];
  action?: { label: string; url: string };
  /** Lines listed after the paragraphs (a digest's notifications), each with its link. */
  items?: Array<{ text: string; url: string }>;
  /** Why this person gets this mail. */
  why: string;
  /** What to do to get no more of it. */
  stop: string;
}

export interface ComposedMail {
  subject: string;
  text: string;
  html: string;
}

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

export function composeMail(content: MailContent): ComposedMail {
  const text = [
    ...content.paragraphs,
    ...(content.action ? [`${content.action.label}: ${content.action.url}`] : []),
    ...(content.items ?? []).map((item) => `- ${item.text}\n  ${item.url}`),
    '--',
    `Why you got this mail: ${content.why}`,
    `How to stop it: ${content.stop}`,
  ].join('\n\n');
  const link = (url: string, label: string) => `<a href="${escapeHtml(url)}">${escapeHtml(label)}</a>`;
  const html = [
    '<!doctype html><html><body>',
    ...content.paragraphs.map((paragraph) => `<p>${escapeHtml(paragraph)}</p>`),
    content.action ? `<p><strong>${link(content.action.url, content.action.label)}</strong></p>` : '',
    content.items?.length
      ? `<ul>${content.items.map((item) => `<li>${escapeHtml(item.text)} (${link(item.url, 'open')})</li>`).join('')}</ul>`
      : '',
    '<hr>',
    `<p><small>Why you got this mail: ${escapeHtml(content.why)}</small></p>`,
    `<p><small>How to stop it: ${escapeHtml(content.stop)}</small></p>`,
    '</body></html>',
  ].join('\n');
  return { subject: content.subject, text, html };
}
