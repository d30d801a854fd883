// The pure parts of mail: the sanitiser of received HTML, the layout's escaping and footer, the back-off, the
// settings read from the environment, and signed link tokens.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newSignedToken, signedTokenHash } from '@/lib/auth/signed-links';
import { composeMail } from '@/lib/mail/compose';
import { readMailConfig, retryDelayMs } from '@/lib/mail/config';
import { sanitizeMailHtml } from '@/lib/mail/sanitize-html';

describe('sanitizeMailHtml', () => {
  it('keeps formatting and web links, drops scripts, styles, handlers and other link schemes', () => {
    const html = [
      '<html><head><title>t</title><style>p { color: red }</style></head><body>',
      '<p class="x" onclick="steal()">Hello <b>there</b> &lt;friend&gt;</p>',
      '<a href="https://splitfield.example.org/invite/abc?x=1&amp;y=2" target="_blank">Accept</a>',
      '<a href="javascript:alert(1)">bad</a><a href=" JAVASCRIPT:alert(1)">bad too</a><a href="mailto:a@b.test">mail</a>',
      '<script>alert(1)</script><iframe src="https://evil.test"></iframe><img src="x" onerror="alert(1)">',
      '<form action="https://evil.test"><input name="password"></form><custom-tag>kept text</custom-tag>',
      '</body></html>',
    ].join('');
    expect(sanitizeMailHtml(html)).toBe(
      '<p>Hello <b>there</b> &lt;friend&gt;</p>' +
        '<a href="https://splitfield.example.org/invite/abc?x=1&amp;y=2" rel="noopener noreferrer">Accept</a>' +
        'badbad too<a href="mailto:a@b.test" rel="noopener noreferrer">mail</a>kept text',
    );
  });

  it('escapes quotes in a kept address so it cannot open another attribute', () => {
    expect(sanitizeMailHtml('<a href=\'https://a.test/"onmouseover="x\'>x</a>')).toBe(
      '<a href="https://a.test/&quot;onmouseover=&quot;x" rel="noopener noreferrer">x</a>',
    );
  });
});

describe('composeMail', () => {
  const mail = composeMail({
    subject: 'S',
    paragraphs: ['<b>Ada</b> & co invite you.'],
    action: { label: 'Open', url: 'https://s.test/x?a=1&b=2' },
    items: [{ text: 'One <i>item</i>', url: 'https://s.test/1' }],
    why: 'because <reasons>.',
    stop: 'turn it off.',
  });

  it('says the same words in both parts, escaped in the HTML one', () => {
    expect(mail.text).toBe(
      [
        '<b>Ada</b> & co invite you.',
        'Open: https://s.test/x?a=1&b=2',
        '- One <i>item</i>\n  https://s.test/1',
        '--',
        'Why you got this mail: because <reasons>.',
        'How to stop it: turn it off.',
      ].join('\n\n'),
    );
    expect(mail.html).toContain('<p>&lt;b&gt;Ada&lt;/b&gt; &amp; co invite you.</p>');
    expect(mail.html).toContain('<a href="https://s.test/x?a=1&amp;b=2">Open</a>');
    expect(mail.html).toContain('<li>One &lt;i&gt;item&lt;/i&gt; (<a href="https://s.test/1">open</a>)</li>');
    expect(mail.html).toContain('Why you got this mail: because &lt;reasons&gt;.');
  });
});

describe('mail settings', () => {
  it('uses the local mail server without an SMTP host, and a real one with it', () => {
    expect(readMailConfig({}).smtp).toBeNull();
    expect(readMailConfig({ SPLITFIELD_SMTP_HOST: 'mail.larkspur.test', SPLITFIELD_SMTP_SECURE: '1' }).smtp).toEqual({
      host: 'mail.larkspur.test',
      port: 465,
      secure: true,
      user: null,
      password: null,
    });
    expect(readMailConfig({ NEXTAUTH_URL: 'https://splitfield.larkspur.test/' }).publicUrl).toBe('https://splitfield.larkspur.test');
  });

  it('names the variable that is wrong', () => {
    expect(() => readMailConfig({ SPLITFIELD_SMTP_PORT: '70000' })).toThrow('SPLITFIELD_SMTP_PORT must be at most 65535');
    expect(() => readMailConfig({ SPLITFIELD_MAIL_MAX_ATTEMPTS: '0' })).toThrow('SPLITFIELD_MAIL_MAX_ATTEMPTS must be at least 1');
  });

  it('backs off by doubling from the first wait, at most an hour', () => {
    const config = { retrySeconds: 30 };
    expect([1, 2, 3, 4, 8, 20].map((attempts) => retryDelayMs(config, attempts) / 1000)).toEqual([30, 60, 120, 240, 3600, 3600]);
  });
});

describe('signed link tokens', () => {
  const saved = process.env.NEXTAUTH_SECRET;
  beforeAll(() => {
    process.env.NEXTAUTH_SECRET = 'unit-test-secret';
  });
  afterAll(() => {
    if (saved === undefined) delete process.env.NEXTAUTH_SECRET;
    else process.env.NEXTAUTH_SECRET = saved;
  });

  it('names the stored hash for its own purpose only, and nothing for a changed token', () => {
    const { token, secretHash } = newSignedToken('invitation');
    expect(signedTokenHash('invitation', token)).toBe(secretHash);
    expect(signedTokenHash('password-reset', token)).toBeNull();
    const [nonce, signature] = token.split('.');
    for (let i = 0; i < signature.length; i += 7) {
      const changed = `${signature.slice(0, i)}${signature[i] === 'x' ? 'y' : 'x'}${signature.slice(i + 1)}`;
      expect(signedTokenHash('invitation', `${nonce}.${changed}`)).toBeNull();
    }
    expect(signedTokenHash('invitation', `${nonce.slice(1)}x.${signature}`)).toBeNull();
    expect(signedTokenHash('invitation', '')).toBeNull();
    process.env.NEXTAUTH_SECRET = 'another-server';
    expect(signedTokenHash('invitation', token)).toBeNull();
    process.env.NEXTAUTH_SECRET = 'unit-test-secret';
  });
});
