import type { OutgoingMail } from './mailer';

const footer = '\n\n— Cohesia, the shared home for collective-behaviour trajectory data.';

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

function mail(to: string, subject: string, lines: string[], link: { url: string; label: string }): OutgoingMail {
  const text = `${lines.join('\n\n')}\n\n${link.label}: ${link.url}${footer}`;
  const html =
    lines.map((l) => `<p>${escapeHtml(l)}</p>`).join('') +
    `<p><a href="${escapeHtml(link.url)}">${escapeHtml(link.label)}</a></p>` +
    `<p style="color:#555">${escapeHtml(footer.trim())}</p>`;
  return { to, subject, text, html };
}

export const mailTemplates = {
  embargoEnded: (to: string, title: string, date: string, url: string) =>
    mail(to, `Embargo ended: ${title}`, [`The embargo on "${title}" ended on ${date}: its files are now open to everyone.`], { url, label: 'See the release' }),
  accessRequested: (to: string, requester: string, affiliation: string, title: string, lab: string, purpose: string, url: string) =>
    mail(to, `Access request: ${title}`, [
      `${requester} (${affiliation}) asks for access to the files of "${title}" in ${lab}.`,
      `Stated purpose: ${purpose}`,
      'A curator of the lab approves or denies it; the requester is told either way. The request holds personal data: handle it under your lab\'s and institution\'s rules.',
    ], { url, label: 'Decide on the request' }),
  accessApproved: (to: string, title: string, until: string | null, note: string, url: string) =>
    mail(to, `Access granted: ${title}`, [
      `Your request for the files of "${title}" was approved${until ? ` until ${until}` : ''}.`,
      ...(note ? [`Note from the lab: ${note}`] : []),
      'Sign in and open the release page to download the files.',
    ], { url, label: 'Open the release' }),
  accessDenied: (to: string, title: string, reason: string, url: string) =>
    mail(to, `Access request declined: ${title}`, [`Your request for the files of "${title}" was declined.`, `Reason given by the lab: ${reason}`], { url, label: 'See your requests' }),
  accessRevoked: (to: string, title: string, url: string) =>
    mail(to, `Access withdrawn: ${title}`, [`The lab has withdrawn your access to the files of "${title}".`], { url, label: 'See your requests' }),
  draftSubmitted: (to: string, depositor: string, title: string, lab: string, url: string) =>
    mail(to, `Ready for review: ${title}`, [
      `${depositor} has submitted "${title}" for review in ${lab}.`,
      'As a curator you can publish it as a release or return it with comments.',
    ], { url, label: 'Review the draft' }),
  draftReturned: (to: string, curator: string, title: string, comment: string, url: string) =>
    mail(to, `Changes asked for: ${title}`, [
      `${curator} has returned "${title}" with this comment:`,
      comment,
      'Make the changes and submit the draft again.',
    ], { url, label: 'Open the draft' }),
  draftPublished: (to: string, curator: string, title: string, doi: string, url: string) =>
    mail(to, `Published: ${title}`, [
      `${curator} has published "${title}" as ${doi}.`,
      'The release is immutable; later changes go into a new version.',
    ], { url, label: 'See the release' }),
  verifyEmail: (to: string, name: string, url: string) =>
    mail(to, 'Confirm your e-mail address for Cohesia', [
      `Hello ${name},`,
      'Please confirm that this address is yours so you can sign in to Cohesia.',
      'If you did not create an account, you can ignore this message.',
    ], { url, label: 'Confirm my address' }),
  resetPassword: (to: string, name: string, url: string) =>
    mail(to, 'Choose a new Cohesia password', [
      `Hello ${name},`,
      'Someone asked to reset the password of your Cohesia account. The link works for one hour.',
      'If it was not you, ignore this message: your password stays as it is.',
    ], { url, label: 'Choose a new password' }),
  labInvitation: (to: string, inviter: string, lab: string, role: string, url: string) =>
    mail(to, `You are invited to join ${lab} on Cohesia`, [
      `${inviter} invites you to join ${lab} as ${role}.`,
      'Sign in or create an account with this e-mail address, then accept the invitation. It expires in 7 days.',
    ], { url, label: 'See the invitation' }),
};
