/**
 * The invitation e-mail (invitationMail): the approved protocol version's invitation text in the
 * researcher's own words when there is one (our default wording otherwise), then what the product
 * adds to every invitation: duration, compensation and the personal link. A reminder says so in
 * its subject and first line; a re-sent invitation is the same message again.
 */
export function invitationMail(p: { studyTitle: string; minutes: number; compensation: string; link: string; researcher: string; text?: string | null; reminder?: boolean }): { subject: string; text: string } {
  const pay = p.compensation.trim() ? p.compensation.trim() : "No payment is offered for this study.";
  const own = p.text?.trim();
  const opening = own
    ? own
    : `Hello,

${p.researcher} invites you to take part in a study: "${p.studyTitle}".

You aim at targets on your own phone or tablet by turning the device.`;
  return {
    subject: `${p.reminder ? "Reminder: " : ""}Invitation to take part: ${p.studyTitle}`,
    text: `${p.reminder ? "A friendly reminder of the invitation below; if you have already taken part or do not wish to, please ignore it.\n\n" : ""}${opening}

It takes about ${p.minutes} minutes, with breaks.
Compensation: ${pay}

Your personal link (please do not share it; it opens your own session):
${p.link}

The first page explains the study in full. Taking part is voluntary and you can stop at any moment.
`,
  };
}
