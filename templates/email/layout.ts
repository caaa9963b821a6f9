/**
 * Loadline's e-mail layout: one plain-text and one HTML rendering of the same content. Every e-mail
 * carries the short caution; no remote images or fonts (mail clients block them anyway).
 */
export interface EmailContent {
  subject: string;
  /** Opening line, e.g. "Hello Elena,". */
  greeting: string;
  /** Paragraphs of plain text. */
  paragraphs: string[];
  /** An optional call to action. */
  action?: { label: string; url: string };
}

export const EMAIL_CAUTION =
  'Loadline records decisions made by the athlete’s licensed clinician; it does not diagnose, treat or replace professional care. ' +
  'If a warning sign appears — new numbness between the legs, trouble controlling bladder or bowel, legs getting weaker — stop and get urgent medical care now.';

const escape = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

export function renderEmail(c: EmailContent): { subject: string; text: string; html: string } {
  const text = [
    c.greeting,
    '',
    ...c.paragraphs.flatMap((p) => [p, '']),
    ...(c.action ? [`${c.action.label}: ${c.action.url}`, ''] : []),
    '—',
    'Loadline',
    '',
    EMAIL_CAUTION,
  ].join('\n');
  const html = `<!doctype html><html lang="en"><body style="margin:0;background:#f7f3ec;font-family:'Public Sans',Arial,sans-serif;color:#14202e">
<table role="presentation" width="100%" cellpadding="0" cellspacing="0"><tr><td align="center" style="padding:24px">
<table role="presentation" width="560" cellpadding="0" cellspacing="0" style="max-width:560px;background:#fffdf8;border:1px solid #d9d2c5">
<tr><td style="padding:20px 24px;border-bottom:3px solid #c2571a;font-weight:700;font-size:18px">Loadline</td></tr>
<tr><td style="padding:24px;font-size:15px;line-height:1.5">
<p>${escape(c.greeting)}</p>
${c.paragraphs.map((p) => `<p>${escape(p)}</p>`).join('\n')}
${c.action ? `<p><a href="${escape(c.action.url)}" style="display:inline-block;background:#14202e;color:#fffdf8;padding:10px 16px;text-decoration:none">${escape(c.action.label)}</a></p>` : ''}
</td></tr>
<tr><td style="padding:16px 24px;font-size:12px;color:#5b6470;border-top:1px solid #d9d2c5">${escape(EMAIL_CAUTION)}</td></tr>
</table></td></tr></table></body></html>`;
  return { subject: c.subject, text, html };
}

/** Sample content so a test can render the layout without a database. */
export const SAMPLE_EMAIL: EmailContent = {
  subject: 'Sample notice from Loadline',
  greeting: 'Hello Sample,',
  paragraphs: ['This is a sample paragraph.'],
  action: { label: 'Open Loadline', url: 'http://127.0.0.1:3000/' },
};
