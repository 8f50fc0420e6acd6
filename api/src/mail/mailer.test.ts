import { createServer } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Problem } from '../errors/problem.js';
import { startFakeSmtpServer, type FakeMailbox } from './fake-smtp-server.js';
import { createMailer } from './mailer.js';

/** A port nothing listens on (bound, then closed). */
async function closedPort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

describe('mailer over SMTP to the fake server', () => {
  let mailbox: FakeMailbox;
  beforeAll(async () => {
    mailbox = await startFakeSmtpServer();
  });
  afterAll(() => mailbox.close());

  it('when a message with an attachment is sent, then the fake server receives it whole', async () => {
    const mailer = createMailer({ smtpUrl: mailbox.url, from: 'Headroom <no-reply@headroom.local>' });
    const pdf = Buffer.concat([Buffer.from('%PDF-1.7\n'), Buffer.alloc(3000, 7)]);
    await mailer.send({ to: 'site-lead@example.test', subject: 'Report K3', text: 'Attached.', html: '<p>Attached.</p>', attachments: [{ filename: 'k3.pdf', content: pdf, contentType: 'application/pdf' }], organisationId: 'org-1' });
    const mail = await mailbox.waitFor((m) => m.subject === 'Report K3');
    expect(mail).toMatchObject({ from: 'no-reply@headroom.local', to: ['site-lead@example.test'], organisationId: 'org-1', html: '<p>Attached.</p>' });
    expect(mail.text.trim()).toBe('Attached.');
    expect(mail.attachments).toHaveLength(1);
    expect(mail.attachments[0]).toMatchObject({ filename: 'k3.pdf', contentType: 'application/pdf', size: pdf.length });
    expect(mail.attachments[0]!.content.equals(pdf)).toBe(true);
  });

  it('when no SMTP server is configured, then sending is refused with 503', async () => {
    const mailer = createMailer({ smtpUrl: undefined, from: 'x@example.test' });
    const err = await mailer.send({ to: 'a@example.test', subject: 's', text: 't' }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(Problem);
    expect(err).toMatchObject({ status: 503, message: expect.stringMatching(/SMTP_URL/) });
  });

  it('when the SMTP server cannot be reached, then sending is refused with 503', async () => {
    const mailer = createMailer({ smtpUrl: `smtp://127.0.0.1:${await closedPort()}`, from: 'x@example.test' });
    const err = await mailer.send({ to: 'a@example.test', subject: 's', text: 't' }).catch((e: unknown) => e);
    expect(err).toMatchObject({ status: 503, type: 'unavailable' });
  });
});
