import type { OutgoingMail } from '../mail/mailer.ts';

/** The e-mails Ergodic sends about accounts and projects, in plain text. */
export function passwordResetMail(to: string, link: string, validMinutes: number): OutgoingMail {
  return {
    to,
    subject: 'Reset your Ergodic password',
    text: [
      'Someone (hopefully you) asked to reset the password of your Ergodic account.',
      '',
      `Choose a new password here within ${validMinutes} minutes:`,
      link,
      '',
      'The link works once. If you did not ask for this, ignore this e-mail; your password stays as it is.',
    ].join('\n'),
  };
}

export interface InvitationMailFacts {
  to: string;
  link: string;
  projectName: string;
  role: string;
  inviterName: string;
  validDays: number;
}

export function invitationMail(facts: InvitationMailFacts): OutgoingMail {
  return {
    to: facts.to,
    subject: `${facts.inviterName} invited you to "${facts.projectName}" on Ergodic`,
    text: [
      `${facts.inviterName} invited you to join the project "${facts.projectName}" on Ergodic as ${facts.role === 'editor' ? 'an' : 'a'} ${facts.role}.`,
      '',
      `Accept within ${facts.validDays} days (you can create an account on the way):`,
      facts.link,
      '',
      'If you did not expect this, ignore this e-mail.',
    ].join('\n'),
  };
}
