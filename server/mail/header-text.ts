/**
 * Text chosen by a user that ends up in an e-mail's header or opening line (an organisation's or a
 * sender's name, a report title): one line, no control or invisible formatting characters (line
 * breaks, zero-width and direction-override marks), none of the characters that quote or delimit an
 * address in a header, and at most `max` characters.
 */
export function headerText(text: string, max = 100): string {
  const cleaned = text
    .normalize('NFC')
    .replace(/[\p{Cc}\p{Cf}\p{Cs}\p{Zl}\p{Zp}]/gu, ' ')
    .replace(/[<>"\\]/g, '')
    .replace(/\s+/g, ' ')
    .trim();
  const chars = Array.from(cleaned);
  return chars.length > max
    ? `${chars
        .slice(0, max - 1)
        .join('')
        .trimEnd()}…`
    : cleaned;
}
