/**
 * Invitations go through the mail outbox: the invitation row and its e-mail commit together, the
 * e-mail carries the same one-time link the admin sees once, and its HTML escapes the inviter's name.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashPassword } from '$lib/server/auth/password';
import { Invitation, MailMessage, User } from '$lib/server/db/models';
import * as invitations from '$lib/server/invitations/invitations';
import { openDatabaseUnderTest, type DatabaseUnderTest } from './helpers/database-under-test';

let temp: DatabaseUnderTest;
let admin: User;

beforeAll(async () => {
  temp = await openDatabaseUnderTest();
  admin = await User.create({
    email: 'wren@lanternfish.example',
    name: 'Wren <b>Halloway</b>',
    role: 'admin',
    passwordHash: await hashPassword('not-used-here')
  });
});
afterAll(async () => {
  await temp.remove();
});

describe('invitation e-mail', () => {
  it('queues one e-mail with the one-time link when the caller names the origin', async () => {
    const invitation = await invitations.create(
      { email: 'ines@lanternfish.example', role: 'artist' },
      admin.id,
      new Date(),
      { linkOrigin: 'https://orientry.example' }
    );
    const link = `https://orientry.example/invite/${invitation.token}`;
    const [message] = await MailMessage.findAll({ where: { kind: 'invitation' } });
    expect(message.toAddress).toBe('ines@lanternfish.example');
    expect(message.dedupeKey).toBe(`invitation:${invitation.id}`);
    expect(message.subject).toBe('Wren <b>Halloway</b> invited you to Orientry');
    expect(message.textBody).toContain(`\n${link}\n`);
    expect(message.textBody).toContain('as an artist (submits builds and proposes waivers)');
    expect(message.htmlBody).toContain(`href="${link}"`);
    expect(message.htmlBody).toContain('Wren &lt;b&gt;Halloway&lt;/b&gt; invited you');
    expect(message.htmlBody).not.toContain('<b>Halloway');
    // The link in the e-mail is the accepted one: it leads to the pending invitation.
    expect(await invitations.lookUp(invitation.token)).toMatchObject({ state: 'pending', role: 'artist' });
  });

  it('queues nothing without an origin, so callers that only show the link keep working', async () => {
    const before = await MailMessage.count();
    await invitations.create({ email: 'odile.two@lanternfish.example', role: 'viewer' }, admin.id);
    expect(await MailMessage.count()).toBe(before);
  });

  it('writes neither the invitation nor the e-mail for an address that has an account', async () => {
    const invitationsBefore = await Invitation.count();
    const mailBefore = await MailMessage.count();
    await expect(
      invitations.create({ email: admin.email, role: 'viewer' }, admin.id, new Date(), {
        linkOrigin: 'https://orientry.example'
      })
    ).rejects.toMatchObject({ code: 'invitation.account-exists' });
    expect(await Invitation.count()).toBe(invitationsBefore);
    expect(await MailMessage.count()).toBe(mailBefore);
  });
});
