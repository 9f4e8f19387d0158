import { roleLabels, type Role } from '../../shared/api/auth';

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

function page(paragraphs: string[], link: { href: string; label: string }, after: string[]): string {
  const p = (t: string) => `<p style="margin:0 0 12px">${escapeHtml(t)}</p>`;
  return `<!doctype html><html><body style="font-family:sans-serif;font-size:15px;line-height:1.4;color:#1d2530">${paragraphs.map(p).join('')}<p style="margin:16px 0"><a href="${escapeHtml(link.href)}" style="background:#1f5f8b;color:#fff;padding:10px 16px;border-radius:4px;text-decoration:none">${escapeHtml(link.label)}</a></p><p style="margin:0 0 12px;font-size:13px">${escapeHtml(link.href)}</p>${after.map(p).join('')}</body></html>`;
}

export function invitationMail(o: { inviter: string; shopName: string; role: Role; link: string; expiresAt: Date }) {
  const role = roleLabels[o.role].toLowerCase();
  const until = o.expiresAt.toUTCString();
  return {
    subject: `${o.inviter} invited you to ${o.shopName} on Wirewalk`,
    text: `${o.inviter} invited you to join ${o.shopName} on Wirewalk as ${role}.\n\nChoose your password and join here:\n${o.link}\n\nThe link works once and until ${until}.\nIf you did not expect this, ignore this message.\n`,
    html: page(
      [`${o.inviter} invited you to join ${o.shopName} on Wirewalk as ${role}.`],
      { href: o.link, label: 'Choose a password and join' },
      [`The link works once and until ${until}.`, 'If you did not expect this, ignore this message.'],
    ),
  };
}

export function passwordResetMail(o: { name: string; link: string }) {
  return {
    subject: 'Reset your Wirewalk password',
    text: `Hello ${o.name},\n\nSomeone (we hope you) asked to reset your Wirewalk password. Choose a new one here:\n${o.link}\n\nThe link works once and for one hour. Resetting signs you out everywhere.\nIf you did not ask, ignore this message; your password stays as it is.\n`,
    html: page(
      [`Hello ${o.name},`, 'Someone (we hope you) asked to reset your Wirewalk password.'],
      { href: o.link, label: 'Choose a new password' },
      ['The link works once and for one hour. Resetting signs you out everywhere.', 'If you did not ask, ignore this message; your password stays as it is.'],
    ),
  };
}
