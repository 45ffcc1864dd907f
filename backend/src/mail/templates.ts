import type { OutgoingMail } from './mail.service';

/** Escapes text for an HTML body. */
export function escapeHtml(s: string): string {
  return s
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&#39;');
}

export function layout(title: string, paragraphs: string[], link: { href: string; label: string }): string {
  const ps = paragraphs.map((p) => `<p style="margin:0 0 16px">${escapeHtml(p)}</p>`).join('\n');
  const href = escapeHtml(link.href);
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>${escapeHtml(title)}</title></head>
<body style="margin:0;padding:24px;background:#F7F5F0;color:#1E2421;font-family:Roboto,Arial,sans-serif;font-size:16px;line-height:1.5">
<div style="max-width:560px;margin:0 auto;background:#ffffff;border-radius:10px;padding:24px">
<p style="margin:0 0 16px;color:#2F5D50;font-weight:700;font-size:20px">Loamline</p>
${ps}
<p style="margin:24px 0"><a href="${href}" style="background:#2F5D50;color:#ffffff;padding:12px 20px;border-radius:10px;text-decoration:none;font-weight:500">${escapeHtml(link.label)}</a></p>
<p style="margin:0;font-size:13px;color:#555">Or paste this address into your browser: <a href="${href}" style="color:#2F5D50">${href}</a></p>
</div></body></html>`;
}

export function passwordResetMail(to: string, name: string, link: string, minutes: number): OutgoingMail {
  const lines = [
    `Hello ${name},`,
    `Someone (we hope you) asked to reset the password of your Loamline account. The link below works once, for ${minutes} minutes.`,
    'If you did not ask for this, ignore this e-mail: your password stays as it is.',
  ];
  return {
    to,
    subject: 'Reset your Loamline password',
    text: `${lines.join('\n\n')}\n\nSet a new password: ${link}\n`,
    html: layout('Reset your Loamline password', lines, { href: link, label: 'Set a new password' }),
  };
}

export function invitationMail(
  to: string,
  shopName: string,
  role: string,
  invitedBy: string,
  link: string,
  expiresAt: Date,
): OutgoingMail {
  const roleText = role === 'owner' ? 'an owner' : 'a technician';
  const lines = [
    'Hello,',
    `${invitedBy} invites you to join ${shopName} on Loamline as ${roleText}. With the link below you choose your name and password and land in the shop's Workshop.`,
    `The link works once, until ${expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC.`,
  ];
  return {
    to,
    subject: `Join ${shopName} on Loamline`,
    text: `${lines.join('\n\n')}\n\nJoin the team: ${link}\n`,
    html: layout(`Join ${shopName} on Loamline`, lines, { href: link, label: 'Join the team' }),
  };
}
