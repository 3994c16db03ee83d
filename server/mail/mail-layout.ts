// Every e-mail Stepstock sends has one shape: a heading, a few sentences, optional facts as
// label/value pairs, a link back into the app and the shop's name. Built once here as plain text
// and as HTML, so both parts always say the same thing.
export interface MailContent {
  subject: string;
  text: string;
  html: string;
}

export interface MailLayout {
  shopName: string;
  appUrl: string;
  subject: string;
  heading: string;
  paragraphs: string[];
  facts?: Array<[label: string, value: string]>;
  /** A path inside the app, e.g. '/alerts', or a whole https?:// address (a payment page). */
  link?: { label: string; path: string };
  /** A last line under the link (shop hours, why the reader receives this). */
  closing?: string;
}

export function escapeHtml(s: string): string {
  return s
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

export function appLink(appUrl: string, path: string): string {
  if (/^https?:\/\//.test(path)) return path;
  return `${appUrl.replace(/\/+$/, '')}${path.startsWith('/') ? path : `/${path}`}`;
}

export function composeMail(m: MailLayout): MailContent {
  const facts = m.facts ?? [];
  const url = m.link ? appLink(m.appUrl, m.link.path) : null;
  const width = facts.reduce((w, [label]) => Math.max(w, label.length), 0);
  const text = [
    m.heading,
    '',
    ...m.paragraphs.flatMap((p) => [p, '']),
    ...(facts.length ? [...facts.map(([l, v]) => `  ${`${l}:`.padEnd(width + 2)}${v}`), ''] : []),
    ...(url && m.link ? [`${m.link.label}: ${url}`, ''] : []),
    ...(m.closing ? [m.closing, ''] : []),
    `— ${m.shopName}`,
  ].join('\n');

  const html = [
    '<!doctype html><html><body style="font-family:sans-serif;line-height:1.45;color:#1d1d1f">',
    `<h1 style="font-size:1.25em">${escapeHtml(m.heading)}</h1>`,
    ...m.paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`),
    facts.length
      ? `<table style="border-collapse:collapse">${facts
          .map(
            ([l, v]) =>
              `<tr><th style="text-align:left;padding:2px 12px 2px 0">${escapeHtml(l)}</th>` +
              `<td style="padding:2px 0">${escapeHtml(v)}</td></tr>`,
          )
          .join('')}</table>`
      : '',
    url && m.link ? `<p><a href="${escapeHtml(url)}">${escapeHtml(m.link.label)}</a></p>` : '',
    m.closing ? `<p>${escapeHtml(m.closing)}</p>` : '',
    `<p style="color:#5f6368">— ${escapeHtml(m.shopName)}</p>`,
    '</body></html>',
  ].join('\n');

  return { subject: m.subject, text, html };
}
