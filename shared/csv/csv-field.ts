/** CSV fields (RFC 4180: fields with commas, quotes, line breaks or edge spaces in double quotes, quotes doubled). */
export function csvField(value: string): string {
  return /[",\r\n]|^\s|\s$/.test(value) ? `"${value.replaceAll('"', '""')}"` : value;
}

/**
 * Text a spreadsheet could run as a formula (OWASP "CSV Injection"): starting with =, +, @, a tab or
 * a carriage return, or with − not followed by a digit — after any apostrophes, so that guarding is
 * exactly undone by `unguardCsvText` whatever the text.
 */
const FORMULA_RISK = /^'*(?:[=+@\t\r]|-(?![\d.]))/;

/** A text field of an export, with a leading apostrophe when a spreadsheet could run it as a formula. Numbers are not passed here. */
export function csvTextField(value: string): string {
  return csvField(FORMULA_RISK.test(value) ? `'${value}` : value);
}

/** The text `csvTextField` guarded, as it was: the one apostrophe it added is taken off. */
export function unguardCsvText(value: string): string {
  return value.startsWith("'") && FORMULA_RISK.test(value.slice(1)) ? value.slice(1) : value;
}

/** Rows of fields (already formatted) as CSV text with CRLF line ends. */
export function csvLines(rows: readonly (readonly string[])[]): string {
  return rows.map((r) => r.join(',')).join('\r\n') + '\r\n';
}
