// eslint-disable-next-line no-control-regex -- control characters are exactly what is escaped
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f]/g;

/**
 * Makes text taken from a file (a URI, a side-file path) fit to quote in a message: control
 * characters shown as `\uXXXX` escapes, and at most `maxLength` characters. A file chooses these
 * strings; a message that repeats 5,000 characters of one, or carries a raw NUL, says nothing clearly
 * (and a NUL cannot be stored as text by every database).
 *
 * @example shortenForMessage('a'.repeat(300)) → 117 × 'a' followed by '...' (120 characters)
 * @example shortenForMessage('hero.bin\u0000.png') → 'hero.bin\\u0000.png'
 */
export function shortenForMessage(text: string, maxLength = 120): string {
  const printable = text.replace(CONTROL_CHARACTERS, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
  return printable.length > maxLength ? `${printable.slice(0, maxLength - 3)}...` : printable;
}
