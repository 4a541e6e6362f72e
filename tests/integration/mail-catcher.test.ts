import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import nodemailer from 'nodemailer';
import { caughtMails } from '$lib/server/mail/caught-mail';
import { startMailCatcher, type MailCatcher } from '$lib/server/mail/mail-catcher';
import * as outboxView from '$lib/server/mail/mail-outbox-view';
import { openDatabaseUnderTest, type DatabaseUnderTest } from './helpers/database-under-test';

let temp: DatabaseUnderTest;
let catcher: MailCatcher;

beforeAll(async () => {
  temp = await openDatabaseUnderTest();
  catcher = await startMailCatcher({ maxByteLength: 64 * 1024 });
});
afterAll(async () => {
  await catcher.close();
  await temp.remove();
});
beforeEach(async () => {
  await caughtMails().destroy({ where: {} });
});

function transport() {
  return nodemailer.createTransport({ host: catcher.host, port: catcher.port, secure: false, ignoreTLS: true });
}

describe('local mail catcher', () => {
  it('listens on the loopback interface only', () => {
    expect(catcher.host).toBe('127.0.0.1');
    expect(catcher.port).toBeGreaterThan(0);
  });

  it('stores a message with its envelope, headers and both bodies', async () => {
    const unsubscribe = 'http://127.0.0.1:3000/unsubscribe/7.1900000000.' + 'a'.repeat(43);
    await transport().sendMail({
      from: 'Orientry <orientry@localhost>',
      to: 'Priya Castellane <priya@lanternfish.example>',
      subject: '[Tidewatch Props] main · build #1126 failed: 2 new findings',
      text: 'Plain body\n',
      html: '<p>HTML body</p>',
      messageId: '<outbox-41.abcdef012345@localhost>',
      headers: { 'List-Unsubscribe': `<${unsubscribe}>`, 'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click' }
    });
    const [row] = await caughtMails().findAll();
    expect(row.subject).toBe('[Tidewatch Props] main · build #1126 failed: 2 new findings');
    expect(row.messageId).toBe('outbox-41.abcdef012345@localhost');
    expect(JSON.parse(row.envelopeTo)).toEqual(['priya@lanternfish.example']);
    expect(row.envelopeFrom).toBe('orientry@localhost');
    expect(row.toText).toBe('"Priya Castellane" <priya@lanternfish.example>');
    expect(row.textBody).toBe('Plain body\n');
    expect(row.htmlBody).toBe('<p>HTML body</p>');
    expect(row.headersText).toMatch(/^List-Unsubscribe-Post: List-Unsubscribe=One-Click$/m);

    // The outbox screen joins folded header lines and lists the links of the bodies.
    const caught = await outboxView.getCaught(row.id);
    expect(caught?.item.outboxId).toBe(41);
    expect(caught?.preview.headers).toContainEqual({ name: 'List-Unsubscribe', value: `<${unsubscribe}>` });
  });

  it('refuses a message over its size limit and stores nothing', async () => {
    await expect(
      transport().sendMail({
        from: 'orientry@localhost',
        to: 'priya@lanternfish.example',
        subject: 'Too big',
        text: 'x'.repeat(100 * 1024)
      })
    ).rejects.toMatchObject({ responseCode: 552 });
    expect(await caughtMails().count()).toBe(0);
  });

  it('keeps messages from several senders in arrival order', async () => {
    for (const index of [1, 2, 3]) {
      await transport().sendMail({
        from: 'orientry@localhost',
        to: `reader${index}@lanternfish.example`,
        subject: `Message ${index}`,
        text: `Body ${index}`
      });
    }
    const listing = await outboxView.list();
    expect(listing.caught.map((message) => message.subject)).toEqual(['Message 3', 'Message 2', 'Message 1']);
    expect(listing.caughtTotal).toBe(3);
  });
});
