/** Line numbers (1 = the first) of text that holds a control character other than tab and line breaks. */
export function linesWithControlCharacters(text: string, limit = 20): number[] {
  const lines: number[] = [];
  let line = 1;
  for (let i = 0; i < text.length && lines.length < limit; i++) {
    const code = text.charCodeAt(i);
    if (code === 0x0a) line++;
    else if ((code < 0x20 && code !== 0x09 && code !== 0x0d) || code === 0x7f) {
      if (lines[lines.length - 1] !== line) lines.push(line);
    }
  }
  return lines;
}

export const CONTROL_CHARACTER_MESSAGE = 'holds a control character (NUL, escape and the like): save the file again as plain CSV text';
