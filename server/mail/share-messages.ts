import type { OutgoingMail } from './mailer';

/** The e-mail a farm's member gets when a result is shared with the farm. Plain text, like the others. */
export function sharedResultMail({
  to,
  sharerName,
  fromOrganization,
  farmName,
  title,
  note,
  link,
  csv,
  csvName,
}: {
  to: string;
  sharerName: string;
  fromOrganization: string;
  farmName: string;
  title: string;
  note: string | null;
  link: string;
  csv: string;
  csvName: string;
}): OutgoingMail {
  return {
    to,
    subject: `${sharerName} shared “${title}” with ${farmName} on Troughline`,
    text: [
      `${sharerName} (${fromOrganization}) shared a result with ${farmName}: ${title}.`,
      ...(note ? ['', `Their note: ${note}`] : []),
      '',
      `Open it (sign in as a member of ${farmName}): ${link}`,
      '',
      'The same result is attached as a CSV file for a spreadsheet.',
      '',
      'Troughline gives decision support, not feeding instructions: a veterinarian or qualified animal nutritionist must review a diet before it is fed, and local feed rules (including those on insect protein) apply.',
    ].join('\n'),
    attachments: [{ filename: csvName, content: csv, contentType: 'text/csv; charset=utf-8' }],
  };
}
