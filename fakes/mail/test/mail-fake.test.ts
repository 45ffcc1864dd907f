import assert from 'node:assert/strict';
import { spawn } from 'node:child_process';
import { connect, createServer } from 'node:net';
import { resolve } from 'node:path';
import { after, before, beforeEach, describe, it } from 'node:test';
import { simpleParser, type AddressObject } from 'mailparser';
import nodemailer, { type Transporter } from 'nodemailer';
import { type MailFake, startMailFake } from '../src/mail-fake';
import { MAIL_FRAME_SANDBOX } from '../src/pages';
import type { MailMessage } from '../src/store';

const ROOT = resolve(__dirname, '../../..');

/** The fake under test, on ports the system picked (port 0), with a real nodemailer client. */
let fake: MailFake;
let transport: Transporter;

const web = (path: string, init?: RequestInit): Promise<Response> =>
  fetch(`http://127.0.0.1:${fake.webPort}${path}`, init);

async function inbox(query = ''): Promise<MailMessage[]> {
  const res = await web(`/api/messages${query}`);
  assert.equal(res.status, 200);
  return (await res.json()) as MailMessage[];
}

function transportTo(port: number, pool = false): Transporter {
  return nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true, pool });
}

function addressesOf(header: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(header) ? header : header ? [header] : [];
  return list.flatMap((h) => h.value.map((v) => v.address ?? ''));
}

/** The five characters escapeHtml replaces, turned back (the browser does this for an attribute). */
function unescapeAttribute(s: string): string {
  return s
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&amp;/g, '&');
}

before(async () => {
  fake = await startMailFake({ smtpPort: 0, webPort: 0 });
  transport = transportTo(fake.smtpPort);
});

after(async () => {
  transport.close();
  await fake.close();
});

beforeEach(() => fake.store.clear());

void describe('mail fake over SMTP and HTTP', () => {
  void it('answers its health route', async () => {
    const res = await web('/health');
    assert.equal(res.status, 200);
    assert.match(res.headers.get('content-type') ?? '', /^application\/json/);
    assert.deepEqual(await res.json(), { status: 'ok', service: 'mail-fake' });
  });

  void it('keeps a hand-written RFC 5322 message byte for byte and reads its headers', async () => {
    // The header values of RFC 5322 Appendix A.1.1 (Date, Message-ID), with invented addresses.
    const raw = Buffer.from(
      [
        'From: Loamline Workshop <workshop@loamline.test>',
        'To: Rider One <rider.one@example.test>, rider.two@example.test',
        'Cc: Shop Owner <owner@example.test>',
        // RFC 2047 §4.2 "Q" encoding: =E2=80=94 is U+2014 EM DASH in UTF-8 (RFC 3629), "_" is a space.
        'Subject: =?UTF-8?Q?Your_baseline_sheet_=E2=80=94_ready?=',
        'Date: Fri, 21 Nov 1997 09:55:06 -0600',
        'Message-ID: <1234@local.machine.example>',
        'MIME-Version: 1.0',
        'Content-Type: text/plain; charset=utf-8',
        '',
        'This is a message just to say hello.',
        // RFC 5321 §4.5.2: the client doubles a leading dot, the server removes it again.
        '.A line that starts with a dot.',
        'Your sheet: https://loamline.test/sheets/42 (open it).',
        '',
      ].join('\r\n'),
    );
    await transport.sendMail({
      envelope: {
        from: 'workshop@loamline.test',
        to: ['rider.one@example.test', 'rider.two@example.test', 'owner@example.test', 'hidden@example.test'],
      },
      raw,
    });
    const [m] = await inbox();
    assert.ok(m);

    const source = await web(`/api/messages/${m.id}/raw`);
    assert.equal(source.status, 200);
    assert.equal(source.headers.get('content-type'), 'text/plain; charset=utf-8');
    assert.ok(Buffer.from(await source.arrayBuffer()).equals(raw), 'the source is kept as it was sent');

    assert.equal(m.from, '"Loamline Workshop" <workshop@loamline.test>');
    assert.deepEqual(m.to, ['rider.one@example.test', 'rider.two@example.test']);
    assert.equal(m.subject, 'Your baseline sheet \u2014 ready');
    // RFC 5322 §3.3: the zone -0600 is six hours behind UTC, so 09:55:06 -0600 is 15:55:06Z.
    assert.equal(m.date, '1997-11-21T15:55:06.000Z');
    assert.match(m.text, /^\.A line that starts with a dot\.$/m);
    assert.equal(m.html, null);
    assert.deepEqual(m.links, ['https://loamline.test/sheets/42']);

    // Cc and the envelope-only (Bcc) recipient find it too.
    assert.deepEqual(
      (await inbox('?to=owner@example.test')).map((x) => x.id),
      [m.id],
    );
    assert.deepEqual(
      (await inbox('?to=HIDDEN@example.test')).map((x) => x.id),
      [m.id],
    );

    const parsed = await simpleParser(raw);
    assert.equal(parsed.messageId, '<1234@local.machine.example>');
    assert.equal(parsed.subject, m.subject);
  });

  void it('reads back what nodemailer composes, as the app sends it (RFC 5322, parsed with mailparser)', async () => {
    const sent = {
      from: 'Loamline <no-reply@loamline.test>',
      to: 'Rider One <rider.one@example.test>',
      subject: 'Reset your Loamline password',
      date: new Date('2031-06-15T08:00:00.000Z'),
      text: 'Reset it here: http://127.0.0.1:3000/reset-password?token=abc&email=r%40example.test',
      html:
        '<p>Reset it <a href="http://127.0.0.1:3000/reset-password?token=abc&amp;email=r%40example.test">here</a>.</p>' +
        '<p><a href="mailto:help@loamline.test">Write to us</a></p>',
    };
    const info = await transport.sendMail(sent);
    const [m] = await inbox();
    assert.ok(m);
    const raw = Buffer.from(await (await web(`/api/messages/${m.id}/raw`)).arrayBuffer());
    const text = raw.toString('utf8');

    // RFC 5322 §2.1: lines end in CRLF; the header section ends at the first empty line.
    const end = text.indexOf('\r\n\r\n');
    assert.ok(end > 0);
    assert.doesNotMatch(text.replace(/\r\n/g, ''), /[\r\n]/);
    const headerLines = text.slice(0, end).split('\r\n');
    for (const line of headerLines) {
      // RFC 5322 §2.2: field-name (printable US-ASCII but ":") then ":", or a folded continuation (WSP first).
      assert.match(line, /^(?:[\x21-\x39\x3b-\x7e]+:|[ \t])/, line);
    }
    // RFC 5322 §3.6: exactly one Date and one From field.
    assert.equal(headerLines.filter((l) => /^date:/i.test(l)).length, 1);
    assert.equal(headerLines.filter((l) => /^from:/i.test(l)).length, 1);

    // mailparser reading the kept source agrees with the JSON inbox and with what was sent.
    const parsed = await simpleParser(raw);
    assert.equal(parsed.messageId, info.messageId);
    assert.equal(parsed.from?.text, m.from);
    assert.equal(m.from, '"Loamline" <no-reply@loamline.test>');
    assert.deepEqual(addressesOf(parsed.to), m.to);
    assert.deepEqual(m.to, ['rider.one@example.test']);
    assert.equal(parsed.subject, sent.subject);
    assert.equal(m.subject, sent.subject);
    assert.equal(parsed.date?.toISOString(), m.date);
    assert.equal(m.date, '2031-06-15T08:00:00.000Z');
    assert.equal(parsed.html, m.html);
    assert.equal(m.text.trim(), sent.text);
    // HTML Living Standard §13.5: "&amp;" in the href is "&" in the link.
    assert.deepEqual(m.links, [
      'http://127.0.0.1:3000/reset-password?token=abc&email=r%40example.test',
      'mailto:help@loamline.test',
    ]);

    const one = await web(`/api/messages/${m.id}`);
    assert.equal(one.status, 200);
    assert.match(one.headers.get('content-type') ?? '', /^application\/json/);
    assert.deepEqual(await one.json(), m);
  });

  void it('filters by recipient in any case and lists the newest first', async () => {
    for (const [to, subject] of [
      ['rider.a@example.test', 'first'],
      ['rider.b@example.test', 'second'],
      ['Rider.A@Example.test', 'third'],
    ]) {
      await transport.sendMail({ from: 'no-reply@loamline.test', to, subject, text: subject });
    }
    assert.deepEqual(
      (await inbox()).map((m) => m.subject),
      ['third', 'second', 'first'],
    );
    assert.deepEqual(
      (await inbox('?to=RIDER.A%40example.test')).map((m) => m.subject),
      ['third', 'first'],
    );
    assert.deepEqual(
      (await inbox('?to=rider.b@example.test')).map((m) => m.subject),
      ['second'],
    );
    assert.deepEqual(await inbox('?to=nobody@example.test'), []);
  });

  void it('escapes what a mail brings on the inbox page and the message page', async () => {
    const subject = '<script>alert("x")</script> & more';
    await transport.sendMail({
      from: 'Mallory <mallory@example.test>',
      to: 'rider@example.test',
      subject,
      text: 'plain',
      html:
        '<p>Hello<script>alert(1)</script><img src=x onerror="alert(2)"></p>' +
        '<a href="javascript:alert(3)">bad</a> <a href="https://loamline.test/ok?a=1&amp;b=2">ok</a>',
    });
    const [m] = await inbox();
    assert.ok(m);

    const list = await web('/');
    assert.equal(list.status, 200);
    assert.equal(list.headers.get('content-type'), 'text/html; charset=utf-8');
    const listHtml = await list.text();
    assert.doesNotMatch(listHtml, /<script/i);
    assert.ok(listHtml.includes('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; more'));
    assert.ok(listHtml.includes('Loamline mail fake — local test inbox'));
    assert.ok(listHtml.includes(`href="/messages/${m.id}"`));

    const page = await web(`/messages/${m.id}`);
    assert.equal(page.status, 200);
    // No script runs on the page, nor in the mail's frame, which inherits the policy (CSP Level 3 §7.8).
    assert.match(page.headers.get('content-security-policy') ?? '', /default-src 'none'/);
    const pageHtml = await page.text();
    assert.doesNotMatch(pageHtml, /<script|<img|javascript:alert\(3\)">/i);
    assert.ok(pageHtml.includes('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; more'));
    assert.ok(pageHtml.includes(`sandbox="${MAIL_FRAME_SANDBOX}"`));
    assert.equal(MAIL_FRAME_SANDBOX, 'allow-popups allow-top-navigation-by-user-activation');
    const srcdoc = /srcdoc="([^"]*)"/.exec(pageHtml)?.[1];
    assert.ok(srcdoc !== undefined, 'the HTML body is in srcdoc');
    assert.equal(unescapeAttribute(srcdoc), `<base target="_top">${m.html}`);
    // The web link is an anchor, the javascript: one only text.
    assert.ok(pageHtml.includes('<a href="https://loamline.test/ok?a=1&amp;b=2" rel="noreferrer">'));
    assert.ok(pageHtml.includes('<code>javascript:alert(3)</code>'));
    assert.ok(pageHtml.includes(`href="/api/messages/${m.id}/raw"`));
  });

  void it('shows a text-only message in the page, with its links', async () => {
    await transport.sendMail({
      from: 'no-reply@loamline.test',
      to: 'rider@example.test',
      subject: 'Text only',
      text: 'Line <one> & https://loamline.test/t?x=1',
    });
    const [m] = await inbox();
    assert.ok(m);
    const html = await (await web(`/messages/${m.id}`)).text();
    assert.doesNotMatch(html, /<iframe/);
    assert.ok(html.includes('<pre>Line &lt;one&gt; &amp; https://loamline.test/t?x=1'));
    assert.ok(html.includes('<a href="https://loamline.test/t?x=1" rel="noreferrer">'));
  });

  void it('empties the inbox on DELETE', async () => {
    await transport.sendMail({
      from: 'no-reply@loamline.test',
      to: 'rider@example.test',
      subject: 'x',
      text: 'x',
    });
    assert.equal((await inbox()).length, 1);
    const res = await web('/api/messages', { method: 'DELETE' });
    // RFC 9110 §15.3.5: 204 No Content has no body.
    assert.equal(res.status, 204);
    assert.equal(await res.text(), '');
    assert.deepEqual(await inbox(), []);
  });

  void it('answers 404 for an unknown message or route, and 405 for a wrong method', async () => {
    for (const path of ['/api/messages/no-such-id', '/api/messages/no-such-id/raw', '/api/nothing']) {
      const res = await web(path);
      // RFC 9110 §15.5.5: 404 Not Found.
      assert.equal(res.status, 404, path);
      assert.match(res.headers.get('content-type') ?? '', /^application\/json/);
      const body = (await res.json()) as { statusCode: number; error: string };
      assert.equal(body.statusCode, 404);
      assert.equal(body.error, 'Not Found');
    }
    for (const path of ['/messages/no-such-id', '/nothing']) {
      const res = await web(path);
      assert.equal(res.status, 404, path);
      assert.equal(res.headers.get('content-type'), 'text/html; charset=utf-8');
      await res.text();
    }
    const put = await web('/api/messages', { method: 'PUT' });
    // RFC 9110 §15.5.6: a 405 response carries an Allow header.
    assert.equal(put.status, 405);
    assert.equal(put.headers.get('allow'), 'GET, HEAD, DELETE');
    await put.text();
  });
});

void describe('mail fake limits', () => {
  void it('refuses a message over the size limit with 552 and keeps nothing', async () => {
    const small = await startMailFake({ smtpPort: 0, webPort: 0, sizeLimit: 2048 });
    const client = transportTo(small.smtpPort);
    try {
      await assert.rejects(
        client.sendMail({
          from: 'a@loamline.test',
          to: 'b@example.test',
          subject: 'big',
          text: 'x'.repeat(5000),
        }),
        // RFC 1870 §6: a message over the fixed maximum size is refused with 552.
        (err: { responseCode?: number }) => err.responseCode === 552,
      );
      assert.equal(small.store.size, 0);
    } finally {
      client.close();
      await small.close();
    }
  });

  void it('keeps at most maxMessages, the oldest dropped', async () => {
    const capped = await startMailFake({ smtpPort: 0, webPort: 0, maxMessages: 3 });
    const client = transportTo(capped.smtpPort);
    try {
      for (const n of [1, 2, 3, 4, 5]) {
        await client.sendMail({ from: 'a@loamline.test', to: 'b@example.test', subject: `n${n}`, text: 'x' });
      }
      const res = await fetch(`http://127.0.0.1:${capped.webPort}/api/messages`);
      assert.deepEqual(
        ((await res.json()) as MailMessage[]).map((m) => m.subject),
        ['n5', 'n4', 'n3'],
      );
    } finally {
      client.close();
      await capped.close();
    }
  });
});

/** A port that was free a moment ago (the stack script picks its ports the same way). */
function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const srv = createServer();
    srv.on('error', rej);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      srv.close(() => res(port));
    });
  });
}

function refusesTcp(port: number): Promise<boolean> {
  return new Promise((res) => {
    const socket = connect(port, '127.0.0.1');
    socket.once('connect', () => {
      socket.destroy();
      res(false);
    });
    socket.once('error', () => res(true));
  });
}

void describe('mail fake process', () => {
  void it('stops on SIGTERM with exit code 0, also with an idle pooled SMTP connection open', async () => {
    const [smtpPort, webPort] = [await freePort(), await freePort()];
    const child = spawn(process.execPath, ['--import', 'tsx', 'fakes/mail/src/main.ts'], {
      cwd: ROOT,
      env: { ...process.env, SMTP_PORT: String(smtpPort), WEB_PORT: String(webPort) },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let output = '';
    child.stdout.on('data', (d: Buffer) => (output += d.toString()));
    child.stderr.on('data', (d: Buffer) => (output += d.toString()));
    const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((res) =>
      child.once('exit', (code, signal) => res({ code, signal })),
    );
    try {
      const until = Date.now() + 20_000;
      for (;;) {
        const ok = await fetch(`http://127.0.0.1:${webPort}/health`).then(
          (r) => r.ok,
          () => false,
        );
        if (ok) break;
        assert.ok(Date.now() < until && child.exitCode === null, `the fake did not start:\n${output}`);
        await new Promise((r) => setTimeout(r, 100));
      }
      const pooled = transportTo(smtpPort, true);
      await pooled.sendMail({
        from: 'a@loamline.test',
        to: 'b@example.test',
        subject: 'before stop',
        text: 'x',
      });
      const res = await fetch(`http://127.0.0.1:${webPort}/api/messages`);
      assert.equal(((await res.json()) as MailMessage[]).length, 1);

      const stopAsked = Date.now();
      child.kill('SIGTERM');
      const timeout = new Promise<'timeout'>((res) => setTimeout(() => res('timeout'), 5000));
      const result = await Promise.race([exited, timeout]);
      pooled.close();
      assert.notEqual(result, 'timeout', `no exit within 5 s of SIGTERM:\n${output}`);
      assert.deepEqual(result, { code: 0, signal: null });
      assert.ok(Date.now() - stopAsked < 5000);
      // Both servers closed (the idle SMTP client was told 421), not the 3 s fallback exit.
      assert.match(output, /mail fake: SIGTERM, stopped/);
      assert.ok(await refusesTcp(smtpPort), 'SMTP port released');
      assert.ok(await refusesTcp(webPort), 'web port released');
      assert.match(
        output,
        new RegExp(`SMTP on 127\\.0\\.0\\.1:${smtpPort}, inbox on http://127\\.0\\.0\\.1:${webPort}`),
      );
    } finally {
      if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
    }
  });

  void it('close() stops both servers of startMailFake', async () => {
    const f = await startMailFake({ smtpPort: 0, webPort: 0 });
    await f.close();
    assert.ok(await refusesTcp(f.smtpPort));
    assert.ok(await refusesTcp(f.webPort));
  });
});
