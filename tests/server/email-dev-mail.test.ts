import { describe, expect, it } from 'vitest';
import { createTestContext, createTestDb } from '../helpers/test-app';
import { readConfig } from '../../server/lib/config';
import { renderEmail } from '../../server/email/layout';
import { compassWord, describePlace, initialBearingDeg } from '../../server/email/digest-wording';
import { createMailTestContext, join } from './email-helpers';
import { startDevMailServer } from '../../server/email/dev-mail-server';
import { listDevMail } from '../../server/email/dev-mail.repo';
import { createMailer } from '../../server/email/mailer';

describe('development mailbox', async () => {
  const ctx = await createMailTestContext();

  it('lists and shows every message the local server received, with both parts', async () => {
    await join(ctx, ctx.agent(), { email: 'box@example.com', displayName: 'Box <b>', acceptDataLicence: true, password: 'a long enough password' });
    const list = await ctx.agent().get('/api/dev/mail');
    expect(list.status).toBe(200);
    expect(list.body.messages).toHaveLength(1);
    expect(list.body.messages[0]).toMatchObject({ to: 'box@example.com', subject: 'Confirm your e-mail for Syconium' });
    expect(list.body.messages[0].from).toContain('Syconium');

    const one = await ctx.agent().get(`/api/dev/mail/${list.body.messages[0].id}`);
    expect(one.body.text).toContain('Welcome to the atlas, Box <b>');
    // The display name is escaped in the HTML part.
    expect(one.body.html).toContain('Box &lt;b&gt;');
    expect(one.body.html).not.toContain('Box <b>');
    expect((await ctx.agent().get('/api/dev/mail/99999')).status).toBe(404);

    expect((await ctx.agent().delete('/api/dev/mail')).status).toBe(204);
    expect((await ctx.agent().get('/api/dev/mail')).body.messages).toHaveLength(0);
  });

  it('answers only when the Host names this machine (no DNS rebinding)', async () => {
    for (const host of ['127.0.0.1:3030', 'localhost:3030', 'LOCALHOST', 'syconium.localhost:5173', '[::1]:3030', '127.1.2.3']) {
      expect((await ctx.agent().get('/api/dev/mail').set('Host', host)).status, host).toBe(200);
    }
    // A name an attacker points at 127.0.0.1 reaches the server from loopback with its own Host.
    for (const host of ['rebind.example.org', 'localhost.example.org', '127.0.0.1.nip.io', '10.0.0.5:3030', 'evil.com:3030']) {
      const res = await ctx.agent().get('/api/dev/mail').set('Host', host);
      expect(res.status, host).toBe(404);
      expect(JSON.stringify(res.body)).not.toContain('@example.com');
    }
  });

  it('is off (404) in production unless asked for', async () => {
    const production = createTestContext({}, { env: 'production', devMail: readConfig({ NODE_ENV: 'production' }).devMail });
    expect((await production.agent().get('/api/dev/mail')).status).toBe(404);
    expect(readConfig({ NODE_ENV: 'production', SYCONIUM_DEV_MAIL: 'true' }).devMail).toBe(true);
    expect(readConfig({ NODE_ENV: 'development' }).devMail).toBe(true);
  });

  it('reads SMTP settings and the public base URL from the environment', () => {
    const config = readConfig({ NODE_ENV: 'production', SMTP_HOST: 'smtp.example.org', SMTP_PORT: '2525', SMTP_USER: 'u', SMTP_PASS: 'p', SMTP_SECURE: 'false', MAIL_FROM: 'Figs <figs@example.org>', APP_URL: 'https://figs.example.org/' });
    expect(config.smtp).toEqual({ host: 'smtp.example.org', port: 2525, user: 'u', pass: 'p', secure: false });
    expect(config.mailFrom).toBe('Figs <figs@example.org>');
    expect(config.appUrl).toBe('https://figs.example.org');
    expect(readConfig({}).appUrl).toBe('http://127.0.0.1:3030');
  });
});

describe('message layout and digest wording', () => {
  it('renders a text part and an inline-styled HTML part without remote resources', () => {
    const message = renderEmail({ subject: 'S', heading: 'Hello', blocks: [{ kind: 'p', text: 'One & two' }, { kind: 'button', label: 'Go', url: 'http://127.0.0.1:3030/x?a=1&b=2' }], footer: [] });
    expect(message.text).toContain('One & two');
    expect(message.text).toContain('Go:\nhttp://127.0.0.1:3030/x?a=1&b=2');
    expect(message.html).toContain('One &amp; two');
    expect(message.html).toContain('href="http://127.0.0.1:3030/x?a=1&amp;b=2"');
    expect(message.html).not.toMatch(/<img|<link|<script|url\(/i);
  });

  it('names directions and distances from the home place', () => {
    // Geometric definitions (common practice, no source): due north is 0 degrees, due east on the equator 90.
    expect(initialBearingDeg({ lat: 10, lon: 5 }, { lat: 11, lon: 5 })).toBeCloseTo(0, 6);
    expect(initialBearingDeg({ lat: 0, lon: 5 }, { lat: 0, lon: 6 })).toBeCloseTo(90, 6);
    expect(initialBearingDeg({ lat: 0, lon: 5 }, { lat: -1, lon: 4 })).toBeCloseTo(225, 0);
    expect(compassWord(44)).toBe('north-east');
    expect(compassWord(359)).toBe('north');
    expect(compassWord(200)).toBe('south');
    // One degree of latitude is 111.195 km on the IUGG mean sphere (shared CHECKS.md).
    expect(describePlace({ lat: 45, lon: 3 }, { lat: 44, lon: 3 })).toBe('about 111 km south');
    expect(describePlace({ lat: 45, lon: 3 }, { lat: 45.02, lon: 3.01 })).toBe('within about 5 km');
  });
});

describe('development mailbox from another machine', () => {
  it('answers 404 to anyone but this machine', async () => {
    const ctx = createTestContext();
    // Through a proxy on loopback (trusted), the client's own address counts.
    const remote = await ctx.agent().get('/api/dev/mail').set('X-Forwarded-For', '203.0.113.7');
    expect(remote.status).toBe(404);
    expect((await ctx.agent().get('/api/dev/mail')).status).toBe(200);
  });
});

describe('the production transport', () => {
  it('sends over SMTP to the configured relay, skipping reserved demo domains', async () => {
    const { db } = createTestDb();
    // The local server stands in for the relay: the same nodemailer path as production.
    const relay = await startDevMailServer(db, 0);
    const mailer = createMailer({ env: 'production', mailFrom: 'Figs <figs@example.org>', smtp: { host: '127.0.0.1', port: relay.port, secure: false } });
    try {
      const message = renderEmail({ subject: 'Hello', heading: 'Hello', blocks: [{ kind: 'p', text: 'A test.' }], footer: [] });
      await mailer.send({ to: 'grower@demo.syconium.test', ...message });
      await mailer.send({ to: 'real@example.org', ...message });
      const stored = listDevMail(db);
      expect(stored.map((m) => m.to)).toEqual(['real@example.org']);
      expect(stored[0]).toMatchObject({ from: '"Figs" <figs@example.org>', subject: 'Hello' });
      expect(stored[0]!.text).toContain('A test.');
      expect(stored[0]!.html).toContain('A test.');
    } finally {
      mailer.close();
      await relay.close();
    }
  });
});
