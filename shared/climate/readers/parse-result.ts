/** Common result shape of the streaming readers. */
import type { HourlySeries } from '../hourly-series';

/** How many problems a refused file reports. */
export const MAX_REPORTED_PROBLEMS = 10;

export interface ParseProblem {
  /** 1-based line number in the uploaded file. */
  line: number;
  message: string;
}

/** A file is accepted as a whole or refused as a whole. */
export type ParseResult =
  | { ok: true; series: HourlySeries; rowCount: number }
  | {
      ok: false;
      /** The first problems, in line order (at most `MAX_REPORTED_PROBLEMS`). */
      problems: ParseProblem[];
      /** All problems found, including those not listed. */
      problemCount: number;
    };

/** An incremental line parser: push each line (without its line break), then finish. */
export interface LineParser {
  /** Feeds one line; `lineNumber` (1-based) defaults to the count of lines pushed so far. */
  push(line: string, lineNumber?: number): void;
  finish(): ParseResult;
}

/** Collects problems, keeping the first few. */
export class ProblemList {
  readonly listed: ParseProblem[] = [];
  count = 0;

  add(line: number, message: string): void {
    this.count++;
    if (this.listed.length < MAX_REPORTED_PROBLEMS) this.listed.push({ line, message });
  }
}

/**
 * Parses decimal text; undefined when it is not a number. Strict syntax, the same as
 * `/^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/` (optional sign, digits with an optional
 * fraction, optional exponent), checked character by character: a large upload has a million cells.
 */
export function parseDecimal(text: string): number | undefined {
  const n = text.length;
  let i = 0;
  let c = text.charCodeAt(0);
  if (c === 43 || c === 45) i++; // + -
  let digits = 0;
  while (i < n && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
    i++;
    digits++;
  }
  if (i < n && text.charCodeAt(i) === 46) {
    i++;
    while (i < n && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
      i++;
      digits++;
    }
  }
  if (digits === 0) return undefined;
  if (i < n && ((c = text.charCodeAt(i)) === 101 || c === 69)) {
    i++;
    c = text.charCodeAt(i);
    if (c === 43 || c === 45) i++;
    let exponentDigits = 0;
    while (i < n && (c = text.charCodeAt(i)) >= 48 && c <= 57) {
      i++;
      exponentDigits++;
    }
    if (exponentDigits === 0) return undefined;
  }
  return i === n ? Number(text) : undefined;
}
