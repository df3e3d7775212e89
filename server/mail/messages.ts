import type { Role } from '@shared/auth/roles';
import { roleLabels } from '@shared/auth/roles';
import { headerText } from './header-text';
import type { OutgoingMail } from './mailer';

const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

interface MailLink {
  href: string;
  label: string;
}

function layout(paragraphs: string[], link: MailLink | MailLink[]): string {
  const body = paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n');
  const links = (Array.isArray(link) ? link : [link])
    .map((l) => `<p><a href="${escapeHtml(l.href)}" style="color: #1D4E5F">${escapeHtml(l.label)}</a></p>`)
    .join('\n');
  return `<!doctype html><html><body style="font-family: system-ui, sans-serif; color: #1b2a30">
${body}
${links}
<p style="color: #5b6b70; font-size: 13px">Tailroom</p>
</body></html>`;
}

export function passwordResetMail(to: string, link: string, minutes: number): OutgoingMail {
  const lines = [
    'Someone asked to reset the password of your Tailroom account.',
    `The link below works once, for ${minutes} minutes. If it was not you, ignore this message: your password stays as it is.`,
  ];
  return {
    to,
    subject: 'Reset your Tailroom password',
    text: `${lines.join('\n\n')}\n\n${link}\n`,
    html: layout(lines, { href: link, label: 'Choose a new password' }),
  };
}

export function finishSignUpMail(to: string, link: string, hours: number): OutgoingMail {
  const lines = [
    'Someone asked to create a Tailroom account with this e-mail address.',
    `To finish, follow the link below and choose your password. It works once, for ${hours} hours. If it was not you, ignore this message: no account is made.`,
  ];
  return {
    to,
    subject: 'Finish creating your Tailroom account',
    text: `${lines.join('\n\n')}\n\n${link}\n`,
    html: layout(lines, { href: link, label: 'Choose a password and finish' }),
  };
}

/** To an address that asked to sign up but already has an account (the sign-up page does not say so). */
export function accountExistsMail(to: string, signInLink: string, resetLink: string): OutgoingMail {
  const lines = [
    'Someone asked to create a Tailroom account with this e-mail address, but it already has one.',
    'Sign in with it, or choose a new password if you have forgotten yours. If it was not you, ignore this message: nothing has changed.',
  ];
  return {
    to,
    subject: 'You already have a Tailroom account',
    text: `${lines.join('\n\n')}\n\nSign in: ${signInLink}\nForgotten password: ${resetLink}\n`,
    html: layout(lines, [
      { href: signInLink, label: 'Sign in' },
      { href: resetLink, label: 'Choose a new password' },
    ]),
  };
}

export function invitationMail(
  to: string,
  link: string,
  details: { organizationName: string; invitedByName: string; role: Role; days: number },
): OutgoingMail {
  const lines = [
    `${details.invitedByName} invited you to join ${details.organizationName} on Tailroom as ${roleLabels[details.role].toLowerCase()}.`,
    `The invitation is valid for ${details.days} days.`,
  ];
  return {
    to,
    subject: `Join ${details.organizationName} on Tailroom`,
    text: `${lines.join('\n\n')}\n\n${link}\n`,
    html: layout(lines, { href: link, label: 'Accept the invitation' }),
  };
}

export function reportMail(
  to: string,
  link: string,
  details: {
    organizationName: string;
    senderName: string;
    senderEmail: string;
    phone: string;
    title: string;
    message: string;
    expiresAt: Date;
  },
): OutgoingMail {
  // Names and title are the sender's own words: one clean line each (they reach the subject header).
  const organizationName = headerText(details.organizationName);
  details = {
    ...details,
    organizationName,
    senderName: headerText(details.senderName),
    title: headerText(details.title, 150),
  };
  const contact = [details.senderEmail, details.phone].filter((x) => x).join(' or ');
  const lines = [
    `${details.senderName} of ${details.organizationName} sent you a report on heating options for your home: “${details.title}”.`,
    ...(details.message ? [details.message] : []),
    `Open it with the link below; you need no account. The link works until ${details.expiresAt.toISOString().slice(0, 10)}.`,
    `Questions? Reply to this e-mail${contact ? ` or contact ${details.senderName} at ${contact}` : ''}.`,
  ];
  return {
    to,
    subject: `${details.organizationName}: ${details.title}`,
    text: `${lines.join('\n\n')}\n\n${link}\n`,
    html: layout(lines, { href: link, label: 'Open the report' }),
    ...(details.senderEmail ? { replyTo: { name: details.senderName, address: details.senderEmail } } : {}),
  };
}
