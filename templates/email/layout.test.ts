import { describe, expect, it } from 'vitest';
import { EMAIL_CAUTION, renderEmail, SAMPLE_EMAIL, type EmailContent } from './layout';
import { emails } from './messages';

/** Every template with its default sample data, plus the bare layout sample. */
const TEMPLATES: [string, EmailContent][] = [
  ['layout sample', SAMPLE_EMAIL],
  ...(Object.keys(emails) as (keyof typeof emails)[]).map((name): [string, EmailContent] => [name, emails[name]()]),
];

/** The words a reader sees in the HTML: tags dropped, the layout's entities decoded. */
const visibleText = (html: string) =>
  html
    .replace(/<[^>]*>/g, ' ')
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&#39;/g, "'")
    .replace(/&amp;/g, '&')
    .replace(/\s+/g, ' ');

describe('e-mail templates, each rendered from its sample data', () => {
  it('the set of templates is the one these tests cover', () => {
    expect(Object.keys(emails).sort()).toEqual(['invitation', 'letter', 'notice', 'organizationSignup', 'passwordReset', 'recordExport']);
  });

  it.each(TEMPLATES)('%s: a subject, and the same greeting, paragraphs and action in the text and the HTML', (_name, content) => {
    const out = renderEmail(content);
    expect(out.subject).toBe(content.subject);
    expect(out.subject.length).toBeGreaterThan(0);
    expect(out.subject).not.toMatch(/[\r\n]/);
    expect(out.html.startsWith('<!doctype html>')).toBe(true);
    expect(out.html).toContain('<html lang="en">');
    const seen = visibleText(out.html);
    for (const line of [content.greeting, ...content.paragraphs]) {
      expect(out.text, line).toContain(line);
      expect(seen, line).toContain(line.replace(/\s+/g, ' '));
    }
    if (content.action) {
      expect(out.text).toContain(`${content.action.label}: ${content.action.url}`);
      expect(out.html).toContain(`href="${content.action.url}"`);
      expect(seen).toContain(content.action.label);
    }
  });

  it.each(TEMPLATES)('%s: carries the caution in the text and in the HTML', (_name, content) => {
    const out = renderEmail(content);
    expect(out.text.trimEnd().endsWith(EMAIL_CAUTION)).toBe(true);
    expect(visibleText(out.html)).toContain(EMAIL_CAUTION);
  });

  it.each(TEMPLATES)('%s: loads nothing from elsewhere (no remote images, fonts, scripts or styles)', (_name, content) => {
    const { html } = renderEmail(content);
    expect(html).not.toMatch(/<(img|script|link|iframe|object)\b/i);
    expect(html).not.toMatch(/url\(/i);
    expect(html).not.toMatch(/@import/i);
  });

  it('the samples say what each e-mail is for', () => {
    expect(emails.invitation().subject).toBe("You're invited to Sample Club on Loadline");
    expect(emails.invitation().action?.url).toBe('http://127.0.0.1:3000/invite#sample');
    expect(emails.letter().subject).toBe('Clearance letter for Sample Athlete');
    expect(emails.letter().paragraphs.join(' ')).toContain('Full participation from 1 December 2026');
    expect(emails.notice().greeting).toBe('Hello Sample,');
    expect(emails.recordExport().subject).toBe("The copy of Sample Athlete's record is ready");
    expect(emails.recordExport().paragraphs.join(' ')).toContain('works for you only');
  });
});

describe('renderEmail escapes what it is given', () => {
  const hostile: EmailContent = {
    subject: 'Hello <b>there</b>',
    greeting: 'Hello <script>alert(1)</script>,',
    paragraphs: ['<script>document.cookie</script> & <img src=x onerror=alert(2)>', 'Tom "the rock" O\'Neil'],
    action: { label: '<script>label()</script>', url: 'http://127.0.0.1:3000/?a=1&b="><script>alert(3)</script>' },
  };

  it('HTML: no <script>, no injected tag or attribute; the words still read as typed', () => {
    const { html } = renderEmail(hostile);
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/<img/i);
    // The link stays one attribute: the URL cannot close it and open a tag.
    expect(html.match(/href="[^"]*"/g)).toHaveLength(1);
    expect(html).not.toContain('"><script');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).toContain('&lt;img src=x onerror=alert(2)&gt;');
    expect(html).toContain('Tom &quot;the rock&quot; O&#39;Neil');
    expect(html).toContain('href="http://127.0.0.1:3000/?a=1&amp;b=&quot;&gt;&lt;script&gt;alert(3)&lt;/script&gt;"');
    const seen = visibleText(html);
    expect(seen).toContain('Hello <script>alert(1)</script>,');
    expect(seen).toContain('<script>document.cookie</script> & <img src=x onerror=alert(2)>');
  });

  it('text: left as typed (a text part is never interpreted as markup)', () => {
    const { text } = renderEmail(hostile);
    expect(text).toContain('Hello <script>alert(1)</script>,');
    expect(text).toContain('Tom "the rock" O\'Neil');
  });
});
