import { describe, expect, it } from 'vitest';
import { escapeHtml, publicLink, renderMail } from '../../src-api/mail/mail-templates';

describe('renderMail', () => {
  it('escapes every stored text in the HTML body and keeps the plain text readable', () => {
    const sut = renderMail({
      heading: 'SCAR <1>',
      paragraphs: ['Title: <img src=x onerror=alert(1)> & "quotes"'],
      facts: [['Part', "O'Neil <core>"]],
      quote: { label: 'Comment', text: '</blockquote><script>x()</script>' },
      link: { href: 'https://desk.example.test/a?b=1&c=2', label: 'Open' },
    });
    expect(sut.html).not.toMatch(/<img|<script|<core>|<1>/);
    expect(sut.html).toContain('&lt;img src=x onerror=alert(1)&gt; &amp; &quot;quotes&quot;');
    expect(sut.html).toContain('O&#39;Neil &lt;core&gt;');
    expect(sut.html).toContain('href="https://desk.example.test/a?b=1&amp;c=2"');
    expect(sut.text).toContain('Title: <img src=x onerror=alert(1)> & "quotes"');
    expect(sut.text).toContain('https://desk.example.test/a?b=1&c=2');
    expect(sut.text).toContain('> </blockquote><script>x()</script>');
  });

  it('puts only http(s) addresses into a link', () => {
    const sut = renderMail({ heading: 'h', paragraphs: [], link: { href: 'javascript:alert(1)', label: 'Open' } });
    expect(sut.html).not.toContain('href=');
  });

  it('joins the public address and a path without doubled slashes', () => {
    expect(publicLink('http://127.0.0.1:3000/', '/supplier-desk')).toBe('http://127.0.0.1:3000/supplier-desk');
    expect(escapeHtml(`<>&"'`)).toBe('&lt;&gt;&amp;&quot;&#39;');
  });
});
