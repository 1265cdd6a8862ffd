import type { OutgoingMail } from './mailer';

const footer = '\n\n— Cohesia, the shared home for collective-behaviour trajectory data.';
const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function mail(to: string, subject: string, lines: string[], link: { url: string; label: string }): OutgoingMail {
  const text = `${lines.join('\n\n')}\n\n${link.label}: ${link.url}${footer}`;
  const html = lines.map((l) => `<p>${esc(l)}</p>`).join('') + `<p><a href="${esc(link.url)}">${esc(link.label)}</a></p><p style="color:#555">${esc(footer.trim())}</p>`;
  return { to, subject, text, html };
}

export const billingMail = {
  paymentFailed: (to: string, name: string, lab: string, graceEnds: Date, url: string, testMode: boolean) =>
    mail(to, `Payment failed for ${lab}'s storage plan`, [
      `Hello ${name},`,
      `The payment provider could not collect the latest payment for ${lab}'s storage plan on Cohesia.`,
      `Please update the payment details by ${graceEnds.toISOString().slice(0, 10)}. After that date new uploads to the lab are paused until a payment succeeds. Nothing already stored or published is removed or hidden, and published releases stay downloadable.`,
      ...(testMode ? ['(This installation uses the payment provider in test mode: no real money moved.)'] : []),
    ], { url, label: 'Open storage and billing' }),
};
