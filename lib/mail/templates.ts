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
