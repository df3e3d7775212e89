/** CSV fields (RFC 4180: fields with commas, quotes, line breaks or edge spaces in double quotes, quotes doubled). */
export function csvField(value: string): string {
  return /[",\r\n]|^\s|\s$/.test(value) ? `"${value.replaceAll('"', '""')}"` : value;
}

/**
 * A text field of a report export, guarded against spreadsheet formula injection (OWASP "CSV
 * Injection"): text starting with =, +, @, a tab or a carriage return, or with − not followed by a
 * digit, gets a leading apostrophe so that a spreadsheet shows it as text. Numbers are not passed here.
 */
export function csvTextField(value: string): string {
  // Text already starting with an apostrophe before such a character gets one more, so that the
  // equipment reader (which takes one off) gives back exactly what was written.
  const risky = /^[=+@\t\r]/.test(value) || /^-(?![\d.])/.test(value) || /^'[=+\-@\t\r]/.test(value);
  return csvField(risky ? `'${value}` : value);
}

/** Rows of fields (already formatted) as CSV text with CRLF line ends. */
export function csvLines(rows: readonly (readonly string[])[]): string {
  return rows.map((r) => r.join(',')).join('\r\n') + '\r\n';
}
