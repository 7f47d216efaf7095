/**
 * Error thrown for any file that cannot be turned into a spectrum. The message is one line that
 * names the file, the line or column when known, and the problem; it never carries a stack trace
 * meant for users.
 */
export class SpectrumFileError extends Error {
  readonly fileName: string;
  readonly line?: number;
  readonly column?: string | number;
  readonly problem: string;

  constructor(fileName: string, problem: string, where: { line?: number; column?: string | number } = {}) {
    const parts = [fileName];
    if (where.line !== undefined) parts.push(`line ${where.line}`);
    if (where.column !== undefined) {
      parts.push(typeof where.column === 'number' ? `column ${where.column}` : `column "${where.column}"`);
    }
    super(`${parts.join(', ')}: ${problem}`.replace(/[\r\n]+/g, ' '));
    this.name = 'SpectrumFileError';
    this.fileName = fileName;
    this.problem = problem;
    if (where.line !== undefined) this.line = where.line;
    if (where.column !== undefined) this.column = where.column;
  }
}
