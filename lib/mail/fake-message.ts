/** A message as the local SMTP fake keeps it (development and tests only). */
export type FakeMessage = {
  id: number;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
};
