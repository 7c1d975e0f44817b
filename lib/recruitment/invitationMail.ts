/** The invitation e-mail, our own wording: study title, duration, compensation and the personal link. */
export function invitationMail(p: { studyTitle: string; minutes: number; compensation: string; link: string; researcher: string }): { subject: string; text: string } {
  const pay = p.compensation.trim() ? p.compensation.trim() : "No payment is offered for this study.";
  return {
    subject: `Invitation to take part: ${p.studyTitle}`,
    text: `Hello,

${p.researcher} invites you to take part in a study: "${p.studyTitle}".

You aim at targets on your own phone or tablet by turning the device. It takes about ${p.minutes} minutes, with breaks.
Compensation: ${pay}

Your personal link (please do not share it; it opens your own session):
${p.link}

The first page explains the study in full. Taking part is voluntary and you can stop at any moment.
`,
  };
}
