/**
 * The invitation e-mail: who invited the reader, with which role, and the one-time link to set a
 * name and password. Queued in the outbox like every e-mail; the admin also sees the link once on
 * screen, so an invitation still works where mail does not arrive.
 */
import type { Transaction } from 'sequelize';
import type { UserRole } from '../../types/roles';
import { escapeHtml } from './escape-html';
import { MAIL_COLORS, mailButton, mailLink, renderMailHtml } from './mail-layout';
import * as outbox from './outbox';

/** What the e-mail needs. */
export interface InvitationMailInput {
  invitationId: number;
  email: string;
  role: UserRole;
  /** Name of the admin who invited; null when unknown. */
  invitedBy: string | null;
  /** Absolute URL of `/invite/<token>`. */
  link: string;
  expiresAt: Date;
}

const ROLE_WORDS: Record<UserRole, string> = {
  admin: 'an admin (sees and manages everything)',
  lead: 'a lead (edits policies and decides waivers)',
  artist: 'an artist (submits builds and proposes waivers)',
  viewer: 'a viewer (reads reports)'
};

/** Subject, text and HTML of the invitation e-mail. */
export function renderInvitationMail(input: InvitationMailInput): { subject: string; text: string; html: string } {
  const who = input.invitedBy ?? 'An Orientry admin';
  const subject = `${input.invitedBy ?? 'An admin'} invited you to Orientry`;
  const until = `${input.expiresAt.toISOString().slice(0, 10)}`;
  const text = [
    `${who} invited you to Orientry as ${ROLE_WORDS[input.role]}.`,
    'Orientry checks the rotations in glTF animation builds and reports what changed.',
    '',
    `Create your account (the link works once, until ${until}):`,
    input.link,
    '',
    'Not expecting this? Ignore the e-mail; no account is made without the link.'
  ].join('\n');
  const paragraph = (html: string) => `<p style="margin:0 0 14px 0;">${html}</p>`;
  const html = renderMailHtml({
    title: subject,
    preview: `Create your account as ${input.role}; the link works until ${until}.`,
    bodyHtml: [
      `<h1 style="margin:0 0 12px 0;font-size:17px;line-height:24px;font-weight:600;">You are invited</h1>`,
      paragraph(`${escapeHtml(who)} invited you to Orientry as ${escapeHtml(ROLE_WORDS[input.role])}.`),
      paragraph('Orientry checks the rotations in glTF animation builds and reports what changed.'),
      paragraph(mailButton(input.link, 'Create your account')),
      paragraph(
        `<span style="color:${MAIL_COLORS.ink600};font-size:13px;">The link works once, until ${escapeHtml(until)}. ` +
          `If the button does not work, open this address: ${mailLink(input.link, input.link)}</span>`
      )
    ].join('\n'),
    footerHtml: 'Not expecting this? Ignore the e-mail; no account is made without the link.'
  });
  return { subject, text: text + '\n', html };
}

/** Queues the invitation e-mail (once per invitation). */
export async function queueInvitationMail(
  input: InvitationMailInput,
  options: { transaction?: Transaction } = {}
): Promise<void> {
  const mail = renderInvitationMail(input);
  await outbox.enqueue(
    {
      kind: 'invitation',
      toAddress: input.email,
      subject: mail.subject,
      textBody: mail.text,
      htmlBody: mail.html,
      dedupeKey: `invitation:${input.invitationId}`
    },
    options
  );
}
