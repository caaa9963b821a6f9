import type { EmailContent } from './layout';

/** The e-mails Loadline sends, as content for the layout. Each has default sample data for tests. */
export const emails = {
  invitation(
    d: { organizationName: string; inviterName: string; roles: string; link: string; expiresAt: string } = {
      organizationName: 'Sample Club',
      inviterName: 'Sample Admin',
      roles: 'coach',
      link: 'http://127.0.0.1:3000/invite#sample',
      expiresAt: '2026-12-05',
    },
  ): EmailContent {
    return {
      subject: `You're invited to ${d.organizationName} on Loadline`,
      greeting: 'Hello,',
      paragraphs: [
        `${d.inviterName} has invited you to join ${d.organizationName} on Loadline as ${d.roles}.`,
        `The link works once and until ${d.expiresAt}. If you did not expect this, you can ignore this e-mail.`,
      ],
      action: { label: 'Accept the invitation', url: d.link },
    };
  },
  organizationSignup(
    d: { name: string; organizationName: string; link: string; hours: number; existingAccount: boolean } = {
      name: 'Sample Admin',
      organizationName: 'Sample Club',
      link: 'http://127.0.0.1:3000/start/confirm#sample',
      hours: 24,
      existingAccount: false,
    },
  ): EmailContent {
    return {
      subject: `Confirm your e-mail to start ${d.organizationName} on Loadline`,
      greeting: `Hello ${d.name},`,
      paragraphs: [
        `Someone, hopefully you, asked to start ${d.organizationName} on Loadline with this address as its first admin.`,
        d.existingAccount
          ? 'This address already has a Loadline account. Confirming adds the new organization to it: sign in with the password you already use (the password typed in the form is not used).'
          : 'Confirming the address creates the organization and your account; then sign in with the password you chose.',
        `The link works once, for the next ${d.hours} hours. If you did not ask for this, ignore this e-mail: nothing is created.`,
      ],
      action: { label: 'Confirm and start the organization', url: d.link },
    };
  },
  passwordReset(
    d: { name: string; link: string; minutes: number } = { name: 'Sample', link: 'http://127.0.0.1:3000/reset#sample', minutes: 30 },
  ): EmailContent {
    return {
      subject: 'Choose a new Loadline password',
      greeting: `Hello ${d.name},`,
      paragraphs: [
        'Someone, hopefully you, asked to set a new password for your Loadline account.',
        `The link below works once, for the next ${d.minutes} minutes. Setting a new password signs your account out everywhere else.`,
        'If you did not ask for this, ignore this e-mail: your password stays as it is.',
      ],
      action: { label: 'Choose a new password', url: d.link },
    };
  },
  notice(
    d: { name: string; title: string; body: string; url: string } = {
      name: 'Sample',
      title: 'Sample notice',
      body: 'Something needs your attention.',
      url: 'http://127.0.0.1:3000/notices',
    },
  ): EmailContent {
    return {
      subject: d.title,
      greeting: `Hello ${d.name},`,
      // A body written in lines (one limit per line) keeps its lines as paragraphs.
      paragraphs: [...d.body.split('\n').filter((l) => l.trim() !== ''), 'Sign in to Loadline to see the details.'],
      action: { label: 'Open Loadline', url: d.url },
    };
  },
  letter(
    d: { name: string; athleteName: string; decision: string; organizationName: string; url: string } = {
      name: 'Sample',
      athleteName: 'Sample Athlete',
      decision: 'Full participation from 1 December 2026',
      organizationName: 'Sample Club',
      url: 'http://127.0.0.1:3000/',
    },
  ): EmailContent {
    return {
      subject: `Clearance letter for ${d.athleteName}`,
      greeting: `Hello ${d.name},`,
      paragraphs: [
        `${d.organizationName} has issued a clearance letter for ${d.athleteName}: ${d.decision}.`,
        'The signed letter is attached as a PDF. Anyone holding it can check that it is genuine with the code printed on it.',
      ],
      action: { label: 'Open it in Loadline', url: d.url },
    };
  },
  recordExport(
    d: { name: string; athleteName: string; organizationName: string; link: string; expiresOn: string } = {
      name: 'Sample',
      athleteName: 'Sample Athlete',
      organizationName: 'Sample Club',
      link: 'http://127.0.0.1:3000/record-download?org=sample#sample',
      expiresOn: '2026-12-11',
    },
  ): EmailContent {
    return {
      subject: `The copy of ${d.athleteName}'s record is ready`,
      greeting: `Hello ${d.name},`,
      paragraphs: [
        `The copy you asked for of everything ${d.organizationName} keeps in Loadline about ${d.athleteName} is ready to download.`,
        `The link works for you only, once you are signed in, until ${d.expiresOn}. After that, ask for a new copy on your account page.`,
        'If you did not ask for this, tell your organization: nobody else can open the link.',
      ],
      action: { label: 'Download the record', url: d.link },
    };
  },
};
