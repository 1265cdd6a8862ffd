// HTML of the stand-in's own pages: hosted checkout, billing portal, invoice.
// Deliberately plain: it must look like a local test tool, not like a real payment page.

const esc = (s: unknown) => String(s ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

export const money = (minor: number, currency: string) =>
  new Intl.NumberFormat('en-GB', { style: 'currency', currency: currency.toUpperCase() }).format(minor / 100);

const date = (seconds: number) => new Date(seconds * 1000).toISOString().slice(0, 10);

function shell(title: string, body: string) {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(title)}</title>
<style>
  body { font: 15px/1.5 ui-monospace, Menlo, Consolas, monospace; background: #f2f2f2; color: #111; margin: 0; }
  .strip { background: repeating-linear-gradient(45deg, #ffd84d, #ffd84d 12px, #222 12px, #222 24px); height: 10px; }
  main { max-width: 34rem; margin: 2rem auto; background: #fff; border: 2px dashed #444; padding: 1.5rem 2rem; }
  h1 { font-size: 1.2rem; margin: 0 0 .25rem; } h2 { font-size: 1rem; margin: 1.5rem 0 .5rem; }
  .note { background: #fff7cc; border: 1px solid #c9a400; padding: .5rem .75rem; font-size: .85rem; }
  .error { background: #ffe3e3; border: 1px solid #b00020; padding: .5rem .75rem; margin: 1rem 0; }
  label { display: block; margin-top: .75rem; font-weight: bold; font-size: .85rem; }
  input { font: inherit; width: 100%; box-sizing: border-box; padding: .4rem; border: 1px solid #555; }
  button { font: inherit; margin-top: 1rem; padding: .5rem 1rem; border: 2px solid #111; background: #111; color: #fff; cursor: pointer; }
  button.secondary { background: #fff; color: #111; }
  table { border-collapse: collapse; width: 100%; font-size: .85rem; } td, th { border-bottom: 1px solid #ccc; padding: .25rem; text-align: left; }
  .row { display: flex; gap: 1rem; } .row > div { flex: 1; }
  code { background: #eee; padding: 0 .2rem; }
</style></head>
<body><div class="strip"></div><main>${body}</main></body></html>`;
}

export type CheckoutView = {
  id: string;
  planName: string;
  amount: number;
  currency: string;
  email: string | null;
  cancelUrl: string | null;
  error?: string;
  card?: string;
};

/** The hosted checkout page where a test card number is typed. */
export function checkoutPage(v: CheckoutView) {
  return shell(
    'Payment stand-in — test mode',
    `<h1>Payment stand-in — test mode</h1>
<p class="note">This is a local stand-in for the payment provider's hosted checkout. <strong>No real payment happens</strong> and no card data leaves this machine.</p>
<h2>Subscribe</h2>
<table><tr><th>Item</th><th>Per month</th></tr><tr><td>${esc(v.planName)}</td><td>${esc(money(v.amount, v.currency))}</td></tr></table>
${v.email ? `<p>Billing e-mail: ${esc(v.email)}</p>` : ''}
${v.error ? `<div class="error" role="alert">${esc(v.error)}</div>` : ''}
<form method="post" action="/checkout/${esc(v.id)}">
  <label for="card">Card number</label>
  <input id="card" name="card" inputmode="numeric" autocomplete="off" value="${esc(v.card ?? '')}" placeholder="4242 4242 4242 4242" required>
  <div class="row">
    <div><label for="expiry">Expiry (MM / YY)</label><input id="expiry" name="expiry" value="12 / 34" required></div>
    <div><label for="cvc">CVC</label><input id="cvc" name="cvc" value="123" required></div>
  </div>
  <label for="holder">Name on card</label>
  <input id="holder" name="holder" value="Test Cardholder">
  <button type="submit">Pay and subscribe</button>
</form>
${v.cancelUrl ? `<p><a href="${esc(v.cancelUrl)}">Cancel and return</a></p>` : ''}
<h2>Test cards</h2>
<p style="font-size:.8rem">From the provider's testing documentation: <code>4242 4242 4242 4242</code> succeeds,
<code>4000 0000 0000 0002</code> is declined, <code>4000 0000 0000 9995</code> is declined for insufficient funds.</p>`,
  );
}

export function messagePage(title: string, message: string) {
  return shell(`${title} — payment stand-in`, `<h1>${esc(title)}</h1><p>${esc(message)}</p>`);
}

export type PortalView = {
  id: string;
  returnUrl: string | null;
  subscriptions: Array<{ id: string; status: string; planName: string; amount: number; currency: string; periodEnd: number; cancelAtPeriodEnd: boolean }>;
  invoices: Array<{ id: string; number: string; status: string; total: number; currency: string; created: number }>;
};

/** A minimal self-service portal: see and cancel the subscription, see invoices, simulate renewals. */
export function portalPage(v: PortalView) {
  const subs = v.subscriptions
    .map(
      (s) => `<tr><td>${esc(s.planName)}</td><td>${esc(s.status)}${s.cancelAtPeriodEnd ? ' (ends at period end)' : ''}</td><td>${esc(money(s.amount, s.currency))}</td><td>${date(s.periodEnd)}</td></tr>`,
    )
    .join('');
  const actions = v.subscriptions
    .filter((s) => s.status !== 'canceled')
    .map(
      (s) => `<p><strong>${esc(s.planName)}</strong></p>
<form method="post" action="/portal/${esc(v.id)}/subscriptions/${esc(s.id)}/cancel"><button type="submit">Cancel subscription now</button></form>
<p style="font-size:.8rem;margin-top:1rem">Test controls of the stand-in:</p>
<form method="post" action="/portal/${esc(v.id)}/subscriptions/${esc(s.id)}/renew" style="display:inline"><input type="hidden" name="outcome" value="paid"><button class="secondary" type="submit">Simulate renewal: paid</button></form>
<form method="post" action="/portal/${esc(v.id)}/subscriptions/${esc(s.id)}/renew" style="display:inline"><input type="hidden" name="outcome" value="failed"><button class="secondary" type="submit">Simulate renewal: payment fails</button></form>`,
    )
    .join('');
  const invs = v.invoices
    .map((i) => `<tr><td><a href="/invoices/${esc(i.id)}">${esc(i.number)}</a></td><td>${esc(i.status)}</td><td>${esc(money(i.total, i.currency))}</td><td>${date(i.created)}</td></tr>`)
    .join('');
  return shell(
    'Billing portal stand-in — test mode',
    `<h1>Billing portal stand-in — test mode</h1>
<p class="note">A local stand-in for the payment provider's billing portal. No real payment happens.</p>
<h2>Subscriptions</h2>
<table><tr><th>Plan</th><th>Status</th><th>Per month</th><th>Period ends</th></tr>${subs || '<tr><td colspan="4">None</td></tr>'}</table>
${actions}
<h2>Invoices</h2>
<table><tr><th>Number</th><th>Status</th><th>Total</th><th>Date</th></tr>${invs || '<tr><td colspan="4">None</td></tr>'}</table>
${v.returnUrl ? `<p><a href="${esc(v.returnUrl)}">Return to the site</a></p>` : ''}`,
  );
}

export function invoicePage(i: { number: string; status: string; total: number; subtotal: number; currency: string; created: number; lines: Array<{ description: string; amount: number }> }) {
  const lines = i.lines.map((l) => `<tr><td>${esc(l.description)}</td><td>${esc(money(l.amount, i.currency))}</td></tr>`).join('');
  return shell(
    `Invoice ${i.number} — payment stand-in`,
    `<h1>Invoice ${esc(i.number)}</h1>
<p class="note">Issued by the local payment stand-in in test mode. Not a tax document.</p>
<p>Status: ${esc(i.status)} · Date: ${date(i.created)}</p>
<table><tr><th>Description</th><th>Amount</th></tr>${lines}
<tr><th>Subtotal</th><th>${esc(money(i.subtotal, i.currency))}</th></tr><tr><th>Total</th><th>${esc(money(i.total, i.currency))}</th></tr></table>`,
  );
}
