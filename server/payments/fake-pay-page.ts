// The local stand-in's hosted pay page: what the customer sees after following a payment link
// (who is paid, what for, how much) and one button that pays. Our own words and look; no card is
// asked for, because nothing is charged.
import { escapeHtml } from '../mail/mail-layout';

export interface PayPageSession {
  name: string;
  payee: string;
  amountText: string;
  status: 'open' | 'complete' | 'expired';
}

function page(title: string, body: string): string {
  return [
    '<!doctype html><html lang="en"><head><meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>${escapeHtml(title)}</title>`,
    '<style>',
    'body{font-family:system-ui,sans-serif;background:#f3f1ec;color:#1f1d1a;margin:0}',
    'main{max-width:28rem;margin:3rem auto;background:#fff;border-radius:12px;padding:2rem;',
    'box-shadow:0 1px 4px rgba(0,0,0,.12)}',
    'h1{font-size:1.3rem;margin:0 0 1rem}',
    '.amount{font-size:2rem;font-weight:600;margin:.5rem 0 1.5rem}',
    'button{font:inherit;font-size:1.1rem;width:100%;padding:.8rem;border:0;border-radius:8px;',
    'background:#2f5d50;color:#fff;cursor:pointer}',
    'button:focus-visible{outline:3px solid #c98a1b;outline-offset:2px}',
    '.note{color:#55514a;font-size:.9rem;margin-top:1.5rem}',
    '</style></head><body><main>',
    body,
    '<p class="note">Local test payment service: nothing is charged and no card is asked for.</p>',
    '</main></body></html>',
  ].join('\n');
}

export function payPage(s: PayPageSession): string {
  if (s.status === 'complete') {
    return page(
      'Already paid',
      `<h1>This is paid</h1><p>${escapeHtml(s.name)} to ${escapeHtml(s.payee)}: ${escapeHtml(
        s.amountText,
      )}. Thank you.</p>`,
    );
  }
  if (s.status === 'expired') {
    return page(
      'Link ended',
      `<h1>This payment link has ended</h1><p>Ask ${escapeHtml(s.payee)} for a new one.</p>`,
    );
  }
  return page(
    `Pay ${s.payee}`,
    [
      `<h1>Payment to ${escapeHtml(s.payee)}</h1>`,
      `<p>${escapeHtml(s.name)}</p>`,
      `<p class="amount">${escapeHtml(s.amountText)}</p>`,
      // No action: the form posts to this same address, which pays the session.
      `<form method="post"><button type="submit">Pay ${escapeHtml(s.amountText)}</button></form>`,
    ].join('\n'),
  );
}

export function unknownPage(): string {
  return page('Not found', '<h1>No such payment</h1><p>Check the link you were sent.</p>');
}
