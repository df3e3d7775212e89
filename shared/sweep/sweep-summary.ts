/**
 * Sweep step 6, summary: the warnings about the record's length and the option list, and the
 * reliability note of each return-period row (docs/methods.md#warnings). Pure: no I/O.
 */
import type { Common } from './sweep-prepare';
import { RETURN_PERIOD_KINDS, type RowKind, type SweepInput, type SweepWarning } from './sweep-types';

/** Warnings about the record's length and the option list (docs/methods.md#warnings). */
export function warningsOf(input: SweepInput, common: Common): SweepWarning[] {
  const warnings: SweepWarning[] = [];
  const years = common.hours?.years.length ?? null;
  const rp = input.designConditions.extremeMin?.returnPeriod;
  const hasReturnPeriods = rp !== undefined && Object.values(rp).some((v) => typeof v === 'number');
  if (years !== null) {
    if (years < 8) {
      warnings.push({
        code: 'short-record',
        message: `The record has ${years} qualifying year${years === 1 ? '' : 's'}; design values from fewer than 8 years are uncertain, and hour-based figures describe those years only.`,
      });
    }
    if (!hasReturnPeriods) {
      warnings.push({
        code: 'no-return-periods',
        message:
          'The record is too short for return-period temperatures (5- to 50-year); the design temperatures stop at the coldest value it has.',
      });
    } else if (years < 10) {
      warnings.push({
        code: 'return-periods-unreliable',
        message: `Return-period temperatures from ${years} years of record (fewer than 10) are unreliable; the rows are marked.`,
      });
    }
    if (hasReturnPeriods && typeof rp['50'] === 'number' && years < 20) {
      warnings.push({
        code: 'fifty-year-short-record',
        message: `The 50-year temperature is extrapolated from ${years} years of record (fewer than 20); treat it as a rough estimate.`,
      });
    }
  }
  if (common.rule !== 'smallest-capacity') {
    warnings.push({
      code: 'mixed-families',
      message:
        common.rule === 'lowest-life-cycle-cost'
          ? 'The options are of more than one family (fuel-fired, heat pump, electric); among those that cover the design load, the one with the lowest life-cycle cost is selected.'
          : 'The options are of more than one family (fuel-fired, heat pump, electric) and there is no hourly record for life-cycle costs; among those that cover the design load, the one with the lowest installed price is selected.',
    });
  }
  return warnings;
}

/** The note on a return-period row from a short record (docs/methods.md#warnings); null on other rows. */
export function reliabilityNoteOf(kind: RowKind, years: number | null): string | null {
  if (years === null || !RETURN_PERIOD_KINDS.has(kind)) return null;
  if (kind === 'rp50' && years < 20)
    return `Extrapolated from ${years} years of record (fewer than 20): a rough estimate`;
  if (years < 10) return `From ${years} years of record (fewer than 10): unreliable`;
  return null;
}
