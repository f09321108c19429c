/**
 * Plain text and HTML bodies for the mails Yokeline sends. Everything stored (titles, comments,
 * names) is escaped before it goes into HTML: a supplier's answer or an engineer's comment can
 * never inject markup into someone's inbox.
 */
const HTML_ESCAPES: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => HTML_ESCAPES[c]);
}

export interface MailContent {
  heading: string;
  paragraphs: string[];
  facts?: [string, string][];
  /** A comment quoted in full (an engineer's reason for returning a step). */
  quote?: { label: string; text: string } | null;
  link: { href: string; label: string };
}

export interface RenderedMail {
  text: string;
  html: string;
}

/** Only http(s) links go into an href; anything else is shown as text. */
function safeHref(href: string): string | null {
  return /^https?:\/\//i.test(href) ? href : null;
}

export function renderMail(c: MailContent): RenderedMail {
  const lines: string[] = [c.heading, '', ...c.paragraphs.flatMap((p) => [p, ''])];
  if (c.facts?.length) {
    const w = Math.max(...c.facts.map(([k]) => k.length));
    for (const [k, v] of c.facts) lines.push(`${k.padEnd(w)}  ${v}`);
    lines.push('');
  }
  if (c.quote) lines.push(`${c.quote.label}:`, ...c.quote.text.split('\n').map((l) => `> ${l}`), '');
  lines.push(`${c.link.label}:`, c.link.href, '', '— Yokeline, receiving quality at Harrowgate Drive Systems');

  const href = safeHref(c.link.href);
  const facts = c.facts?.length
    ? `<table role="presentation" style="border-collapse:collapse;margin:12px 0">${c.facts
        .map(([k, v]) => `<tr><td style="padding:2px 16px 2px 0;color:#56625f">${escapeHtml(k)}</td><td style="padding:2px 0;font-weight:600">${escapeHtml(v)}</td></tr>`)
        .join('')}</table>`
    : '';
  const quote = c.quote
    ? `<p style="margin:12px 0 4px;color:#56625f">${escapeHtml(c.quote.label)}:</p><blockquote style="margin:0;padding:8px 12px;border-left:3px solid #b4652e;white-space:pre-wrap">${escapeHtml(c.quote.text)}</blockquote>`
    : '';
  const link = href
    ? `<p style="margin:20px 0"><a href="${escapeHtml(href)}" style="background:#12665f;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(c.link.label)}</a></p><p style="color:#56625f;font-size:12px">${escapeHtml(href)}</p>`
    : `<p>${escapeHtml(c.link.label)}: ${escapeHtml(c.link.href)}</p>`;
  const html = `<!doctype html><html><body style="font-family:'Open Sans',Segoe UI,sans-serif;color:#1b2422;max-width:640px">
<h1 style="font-size:18px;color:#0c3d39">${escapeHtml(c.heading)}</h1>
${c.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
${facts}${quote}${link}
<p style="color:#56625f;font-size:12px">Yokeline, receiving quality at Harrowgate Drive Systems</p>
</body></html>`;
  return { text: lines.join('\n'), html };
}

/** PUBLIC_URL + a path, without doubled slashes. */
export function publicLink(publicUrl: string, path: string): string {
  return `${publicUrl.replace(/\/+$/, '')}${path.startsWith('/') ? path : `/${path}`}`;
}
