/** A reader error that names the format and, when known, the 1-based line number. */
export class FormatError extends Error {
  readonly format: string;
  readonly line?: number;
  constructor(format: string, message: string, line?: number) {
    super(line === undefined ? `${format}: ${message}` : `${format} line ${line}: ${message}`);
    this.name = 'FormatError';
    this.format = format;
    this.line = line;
  }
}

/** Split text into lines, accepting \n, \r\n and \r. */
export function splitLines(text: string): string[] {
  const lines = text.split(/\r\n|\r|\n/);
  if (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  return lines;
}
