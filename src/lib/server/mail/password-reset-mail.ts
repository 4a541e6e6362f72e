/**
 * The password-reset e-mail: one button to the signed link, when it stops working, and what to do
 * when the reader did not ask for it.
 */
import { escapeHtml } from './escape-html';
import { MAIL_COLORS, mailButton, mailLink, renderMailHtml } from './mail-layout';

/** What the e-mail needs. */
export interface PasswordResetMailInput {
  name: string;
  link: string;
  expiresAt: Date;
  signInUrl: string;
}

/** Subject, text and HTML of the e-mail. */
export function renderPasswordResetMail(input: PasswordResetMailInput): {
  subject: string;
  text: string;
  html: string;
} {
  const subject = 'Reset your Orientry password';
  const until = `${input.expiresAt.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
  const text = [
    `Hello ${input.name},`,
    '',
    'Someone (probably you) asked to reset the password of your Orientry account.',
    'Choose a new password here; the link works once, until ' + until + ':',
    '',
    input.link,
    '',
    'If you did not ask for this, ignore this e-mail: your password stays as it is.',
    `Sign in: ${input.signInUrl}`
  ].join('\n');
  const paragraph = (html: string) => `<p style="margin:0 0 14px 0;">${html}</p>`;
  const html = renderMailHtml({
    title: subject,
    preview: `Choose a new password; the link works once, until ${until}.`,
    bodyHtml: [
      `<h1 style="margin:0 0 12px 0;font-size:17px;line-height:24px;font-weight:600;">Reset your password</h1>`,
      paragraph(`Hello ${escapeHtml(input.name)},`),
      paragraph('Someone (probably you) asked to reset the password of your Orientry account.'),
      paragraph(mailButton(input.link, 'Choose a new password')),
      paragraph(
        `<span style="color:${MAIL_COLORS.ink600};font-size:13px;">The link works once, until ${escapeHtml(until)}. ` +
          `If the button does not work, open this address: ${mailLink(input.link, input.link)}</span>`
      )
    ].join('\n'),
    footerHtml: `If you did not ask for this, ignore this e-mail: your password stays as it is. ${mailLink(input.signInUrl, 'Sign in')}`
  });
  return { subject, text: text + '\n', html };
}
