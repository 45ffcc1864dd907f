import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { simpleParser } from 'mailparser';
import { extractLinks, MailStore } from '../src/store';

/** A message as it would arrive, lines ended by CRLF as RFC 5322 §2.1 requires. */
function rfc5322(lines: string[]): Buffer {
  return Buffer.from(lines.join('\r\n') + '\r\n');
}

async function addTo(store: MailStore, lines: string[], envelopeTo: string[] = [], receivedAt?: Date) {
  const raw = rfc5322(lines);
  return store.add(await simpleParser(raw), raw, envelopeTo, receivedAt);
}

void describe('extractLinks', () => {
  void it('takes href values from the HTML body, character references decoded', () => {
    const html = [
      // HTML Living Standard §13.5 (named character references): "&amp;" is U+0026 "&".
      '<a href="https://loamline.test/reset?token=abc&amp;email=r%40example.test">reset</a>',
      // HTML Living Standard §13.1.2.3: single-quoted and unquoted attribute values.
      "<a class=x href='https://loamline.test/single'>one</a>",
      '<a href=https://loamline.test/unquoted>two</a>',
      // Numeric character reference: &#x2F; is U+002F SOLIDUS (Unicode code chart).
      '<a href="https://loamline.test&#x2F;numeric">three</a>',
      // An image map's area element carries a link too (HTML Living Standard §4.8.14).
      '<map><area href="https://loamline.test/area" alt=""></map>',
      '<a data-href="https://loamline.test/not-this" href="https://loamline.test/this">four</a>',
      '<!-- <a href="https://loamline.test/commented-out">gone</a> -->',
      '<a href="https://loamline.test/single">again</a>',
      '<a href="#">top</a><a href="mailto:shop@loamline.test">write</a>',
    ].join('\n');
    assert.deepEqual(extractLinks(html, 'https://loamline.test/text-is-ignored'), [
      'https://loamline.test/reset?token=abc&email=r%40example.test',
      'https://loamline.test/single',
      'https://loamline.test/unquoted',
      'https://loamline.test/numeric',
      'https://loamline.test/area',
      'https://loamline.test/this',
      'mailto:shop@loamline.test',
    ]);
  });

  void it('takes the URLs of the text body when there is no HTML or it has no links', () => {
    const text = [
      'Your sheet: https://loamline.test/sheets/7.',
      '(see https://loamline.test/help) and https://loamline.test/wiki_(term), then',
      // RFC 3986 Appendix C: angle brackets delimit a URI in running text.
      'or <https://loamline.test/angle> once more https://loamline.test/sheets/7',
    ].join('\n');
    // Trailing sentence punctuation and an unopened ")" are not part of the link: common practice, no source.
    const expected = [
      'https://loamline.test/sheets/7',
      'https://loamline.test/help',
      'https://loamline.test/wiki_(term)',
      'https://loamline.test/angle',
    ];
    assert.deepEqual(extractLinks(null, text), expected);
    assert.deepEqual(extractLinks('<p>No links here.</p>', text), expected);
    assert.deepEqual(extractLinks(null, 'No links at all.'), []);
  });
});

void describe('MailStore', () => {
  void it('keeps at most `capacity` messages, dropping the oldest, and lists the newest first', async () => {
    const store = new MailStore(2);
    for (const n of [1, 2, 3]) {
      await addTo(store, ['From: a@loamline.test', 'To: b@example.test', `Subject: number ${n}`, '', 'x']);
    }
    assert.equal(store.size, 2);
    assert.deepEqual(
      store.list().map((m) => m.subject),
      ['number 3', 'number 2'],
    );
  });

  void it('matches a recipient in To, Cc, Bcc or the envelope, in any case', async () => {
    const store = new MailStore();
    const m = await addTo(
      store,
      [
        'From: Workshop <workshop@loamline.test>',
        'To: Rider <Rider.One@Example.test>',
        'Cc: owner@example.test',
        'Bcc: bookkeeper@example.test',
        'Subject: filters',
        '',
        'body',
      ],
      ['rider.one@example.test', 'owner@example.test', 'bookkeeper@example.test', 'quiet@example.test'],
    );
    await addTo(store, ['From: a@loamline.test', 'To: someone@example.test', 'Subject: other', '', 'x']);
    for (const to of [
      'RIDER.ONE@example.test',
      'owner@EXAMPLE.test',
      'bookkeeper@example.test',
      'quiet@example.test',
    ]) {
      assert.deepEqual(
        store.list(to).map((x) => x.id),
        [m.id],
        to,
      );
    }
    assert.deepEqual(store.list('nobody@example.test'), []);
    assert.equal(store.list().length, 2);
  });

  void it('reads group addresses, and falls back to the envelope and the arrival time', async () => {
    const store = new MailStore();
    // RFC 5322 §3.4: group = display-name ":" [group-list] ";"
    const grouped = await addTo(store, [
      'From: a@loamline.test',
      'To: Riders: one@example.test, two@example.test;',
      'Subject: group',
      '',
      'x',
    ]);
    assert.deepEqual(grouped.to, ['one@example.test', 'two@example.test']);

    const arrived = new Date('2030-01-02T03:04:05.000Z');
    const bare = await addTo(
      store,
      ['From: a@loamline.test', 'Subject: no To, no Date', '', 'x'],
      ['env@example.test'],
      arrived,
    );
    assert.deepEqual(bare.to, ['env@example.test']);
    assert.equal(bare.date, '2030-01-02T03:04:05.000Z');
    assert.equal(bare.html, null);
    assert.equal(store.get(bare.id), bare);
    assert.equal(store.get('unknown'), undefined);
    store.clear();
    assert.equal(store.size, 0);
  });

  void it('refuses a capacity that is not a positive integer', () => {
    assert.throws(() => new MailStore(0), /positive integer/);
  });
});
