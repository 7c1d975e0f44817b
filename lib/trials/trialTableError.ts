/**
 * Bad input in a trial table: names the file, the 1-based line and the column, and formats as one
 * line `FILE:LINE:COLUMN: message` (the CLI prints it and exits 2; the upload API answers 422).
 */
export class TrialTableError extends Error {
  readonly file: string;
  readonly line: number;
  readonly column: string;
  readonly detail: string;

  constructor(where: { file: string; line: number; column: string }, detail: string) {
    super(`${where.file}:${where.line}:${where.column}: ${detail}`);
    this.name = "TrialTableError";
    this.file = where.file;
    this.line = where.line;
    this.column = where.column;
    this.detail = detail;
  }

  /** Plain object for JSON answers (e.g. the 422 body). */
  toJSON(): { file: string; line: number; column: string; message: string } {
    return { file: this.file, line: this.line, column: this.column, message: this.detail };
  }
}
