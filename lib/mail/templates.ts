/** Our own message texts. Plain text: readable in any client, nothing to render. */

export function passwordResetMail(p: { name: string; link: string }): { subject: string; text: string } {
  return {
    subject: "Yawpoint: reset your password",
    text: `Hello ${p.name},

someone (hopefully you) asked to reset the password of your Yawpoint account.
Open this link within one hour to choose a new password. It works once.

${p.link}

If you did not ask for this, ignore this message: your password stays as it is.
`,
  };
}

export function inviteMail(p: { name: string; role: string; link: string; invitedBy: string }): { subject: string; text: string } {
  return {
    subject: "Yawpoint: your account is ready",
    text: `Hello ${p.name},

${p.invitedBy} has opened a Yawpoint account for you with the role "${p.role}".
Open this link within one hour to choose your password. It works once.

${p.link}
`,
  };
}

export function auditHeadMail(p: { name: string; day: string; at: Date; head: { lastId: number; hash: string; entries: number }; line: string }): { subject: string; text: string } {
  return {
    subject: `Yawpoint audit trail: the head of ${p.day}`,
    text: `Hello ${p.name},

on ${p.day} at ${p.at.toISOString().slice(11, 16)} UTC the audit trail held ${p.head.entries} entries; the newest was number ${p.head.lastId}.
Keep this message outside Yawpoint. To check later that no entry up to that one was changed or removed,
paste this line into "Heads you kept" on the audit page and verify the chain:

${p.line}

Nobody at the lab can change this message once you have it, which is what makes it a check.
`,
  };
}
