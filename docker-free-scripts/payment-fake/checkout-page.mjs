// The hosted test checkout page at a session's `url`: plainly a local test page, with Pay,
// Decline and a way back. No card fields: nothing here is a real payment.
import express from 'express';
import { declineSession, paySession } from './api.mjs';

const esc = (s) => String(s ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]);

function money(minor, currency) {
  try {
    return new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100);
  } catch {
    return `${(minor / 100).toFixed(2)} ${currency.toUpperCase()}`;
  }
}

const STYLE = `
  body { font: 16px/1.5 system-ui, sans-serif; margin: 0; background: #f4f4f0; color: #1d1d1b; }
  .banner { background: #3d3d3a; color: #fff; padding: .75rem 1.5rem; font-weight: 600; }
  main { max-width: 34rem; margin: 2rem auto; background: #fff; border: 2px dashed #6b6b66; padding: 1.5rem 2rem; }
  h1 { font-size: 1.4rem; margin-top: 0; }
  table { border-collapse: collapse; width: 100%; margin: 1rem 0; }
  th, td { text-align: left; padding: .35rem .5rem; border-bottom: 1px solid #d6d6d0; }
  td.num { text-align: right; }
  .actions { display: flex; gap: .75rem; flex-wrap: wrap; align-items: center; margin-top: 1.25rem; }
  button { font: inherit; padding: .55rem 1.25rem; border: 2px solid #1d1d1b; background: #fff; color: #1d1d1b; cursor: pointer; }
  button.pay { background: #1d1d1b; color: #fff; }
  .note { background: #fff4d6; border-left: 4px solid #8a6100; padding: .5rem .75rem; }
  .refused { background: #fde2e0; border-left: 4px solid #a3261c; padding: .5rem .75rem; }
  a { color: #1d4f91; }
  .sr { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); }
  @media (prefers-color-scheme: dark) {
    body { background: #1b1b1a; color: #eeeee8; } main { background: #262624; border-color: #9a9a92; }
    button { background: #262624; color: #eeeee8; border-color: #eeeee8; } button.pay { background: #eeeee8; color: #1b1b1a; }
    .note { background: #3a2f10; } .refused { background: #44201d; } a { color: #9cc3ff; } th, td { border-color: #4a4a46; }
  }`;

function page(title, body) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)} · local test checkout</title><style>${STYLE}</style></head>
<body><div class="banner" role="note">Local test checkout: no real money moves and no card is charged.</div>
<main>${body}</main></body></html>`;
}

export function createCheckoutPage({ store, webhooks }) {
  const router = express.Router();
  router.use(express.urlencoded({ extended: false, limit: '4kb' }));

  const sessionOr404 = (req, res) => {
    const s = store.get('checkout_session', req.params.id);
    if (!s) res.status(404).type('html').send(page('Not found', '<h1>No such checkout</h1><p>This test checkout does not exist (the local payment service may have restarted).</p>'));
    return s;
  };

  const render = (s, extra = '') => {
    const { items } = store.get('session_items', s.id);
    const rows = items.map((l) => `<tr><td>${esc(l.description)}</td><td class="num">${l.quantity}</td><td class="num">${esc(money(l.amount_total, l.currency))}</td></tr>`).join('');
    const back = s.cancel_url ? `<a href="${esc(s.cancel_url)}">Back without paying</a>` : '';
    if (s.status === 'complete') {
      return page('Paid', `<h1>This test checkout is paid</h1><p>${esc(money(s.amount_total, s.currency))} was marked as paid.</p>
        <p><a href="${esc(s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id))}">Continue</a></p>`);
    }
    if (s.status === 'expired') return page('Expired', `<h1>This test checkout has expired</h1><p>Nothing was paid.</p><p>${back}</p>`);
    return page('Pay', `<h1>Test checkout</h1>
      <p class="note">Choose <strong>Pay</strong> to act as if the payment went through, or <strong>Decline</strong> to act as if the card was refused.</p>
      ${extra}
      <table><caption class="sr">What is being bought</caption><thead><tr><th scope="col">Item</th><th scope="col" class="num">Qty</th><th scope="col" class="num">Amount</th></tr></thead>
      <tbody>${rows}</tbody><tfoot><tr><th scope="row" colspan="2">Total</th><td class="num"><strong>${esc(money(s.amount_total, s.currency))}</strong></td></tr></tfoot></table>
      <form method="post" class="actions">
        <button class="pay" type="submit" formaction="/checkout/${esc(s.id)}/pay">Pay ${esc(money(s.amount_total, s.currency))}</button>
        <button type="submit" formaction="/checkout/${esc(s.id)}/decline">Decline</button>
        ${back}
      </form>`);
  };

  router.get('/checkout/:id', (req, res) => {
    const s = sessionOr404(req, res);
    if (s) res.type('html').send(render(s));
  });

  router.post('/checkout/:id/pay', (req, res) => {
    const s = sessionOr404(req, res);
    if (!s) return;
    if (s.status === 'open') paySession(store, webhooks, s);
    if (s.status === 'complete') return res.redirect(303, s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id));
    res.type('html').send(render(s));
  });

  router.post('/checkout/:id/decline', (req, res) => {
    const s = sessionOr404(req, res);
    if (!s) return;
    if (s.status !== 'open') return res.type('html').send(render(s));
    declineSession(store, webhooks, s);
    res.status(402).type('html').send(render(s, '<p class="refused" role="alert">The test card was declined. Nothing was paid; you may try again or go back.</p>'));
  });

  return router;
}
