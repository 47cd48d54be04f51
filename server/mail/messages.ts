import { ROLE_LABELS, type Role } from '../../src/shared/permissions';
import type { OutgoingMail } from './mailer';

/** The words of Troughline's e-mails, in one place. Plain text: it reads the same in every mail program. */
export function invitationMail({ to, organizationName, role, inviterName, link }: { to: string; organizationName: string; role: Role; inviterName: string; link: string }): OutgoingMail {
  return {
    to,
    subject: `${inviterName} invites you to ${organizationName} on Troughline`,
    text: [
      `${inviterName} invites you to join ${organizationName} on Troughline as ${ROLE_LABELS[role].toLowerCase()}.`,
      '',
      `Accept the invitation: ${link}`,
      '',
      'The link works for 7 days. If you did not expect this, ignore this e-mail.',
    ].join('\n'),
  };
}

export function passwordResetMail({ to, link }: { to: string; link: string }): OutgoingMail {
  return {
    to,
    subject: 'Reset your Troughline password',
    text: [
      'Someone asked to reset the password of your Troughline account.',
      '',
      `Choose a new password: ${link}`,
      '',
      'The link works once, for 1 hour. If it was not you, ignore this e-mail: your password stays as it is.',
    ].join('\n'),
  };
}
