/**
 * A rule the designer states for the suggested design point: the lowest life-cycle cost among the
 * design temperatures that keep the worst year's unmet hours and the lifetime odds of a colder night
 * within the stated limits (docs/methods.md#stated-rule). The rule suggests; the licensed designer decides.
 */
import { parseMoney } from '../money/money';

export interface DesignRule {
  /** At most this many unmet hours in the worst year of record (null: no limit). */
  maxUnmetHoursWorstYear: number | null;
  /** At most these lifetime odds of a colder night, % (20 = 1-in-5; null: no limit). */
  maxLifetimeOddsPct: number | null;
}

export interface RuleRow {
  label: string;
  designC: number;
  selectedOptionId: string | null;
  lifeCycleCost: string | null;
  installedPrice: string | null;
  unmetHoursWorstYear: number | null;
  lifetimeExceedanceProbability: number | null;
}

export interface RulePick {
  /** Index of the row the rule picks, or null when none passes. */
  index: number | null;
  /** Why, in a sentence. */
  reason: string;
}

/** A rule in words: "the lowest life-cycle cost with at most 10 unmet hours in the worst year and at most 1-in-5 lifetime odds". */
export function describeRule(rule: DesignRule): string {
  const limits: string[] = [];
  if (rule.maxUnmetHoursWorstYear !== null) {
    limits.push(
      `at most ${rule.maxUnmetHoursWorstYear} unmet ${rule.maxUnmetHoursWorstYear === 1 ? 'hour' : 'hours'} in the worst year of record`,
    );
  }
  if (rule.maxLifetimeOddsPct !== null) {
    const oneIn = rule.maxLifetimeOddsPct > 0 ? Math.round(100 / rule.maxLifetimeOddsPct) : null;
    limits.push(
      `at most ${rule.maxLifetimeOddsPct} % odds of a colder night over the study period${oneIn !== null && oneIn > 1 ? ` (about 1-in-${oneIn})` : ''}`,
    );
  }
  return `the lowest life-cycle cost${limits.length > 0 ? ' with ' + limits.join(' and ') : ''}`;
}

/**
 * The row the rule picks: among rows with a unit and a life-cycle cost that meet every limit, the
 * lowest life-cycle cost; ties go to the colder design temperature (more margin for the same cost).
 */
export function applyDesignRule(rows: readonly RuleRow[], rule: DesignRule): RulePick {
  let best: number | null = null;
  let failedUnmet = 0;
  let failedOdds = 0;
  for (const [i, row] of rows.entries()) {
    if (row.selectedOptionId === null || row.lifeCycleCost === null) continue;
    if (
      rule.maxUnmetHoursWorstYear !== null &&
      !(row.unmetHoursWorstYear !== null && row.unmetHoursWorstYear <= rule.maxUnmetHoursWorstYear)
    ) {
      failedUnmet++;
      continue;
    }
    if (
      rule.maxLifetimeOddsPct !== null &&
      !(
        row.lifetimeExceedanceProbability !== null && row.lifetimeExceedanceProbability * 100 <= rule.maxLifetimeOddsPct
      )
    ) {
      failedOdds++;
      continue;
    }
    const current = best === null ? undefined : rows[best];
    if (current === undefined) {
      best = i;
      continue;
    }
    const cmp = parseMoney(row.lifeCycleCost).cmp(parseMoney(current.lifeCycleCost ?? '0'));
    if (cmp < 0 || (cmp === 0 && row.designC < current.designC)) best = i;
  }
  const words = describeRule(rule);
  if (best === null) {
    const why =
      failedUnmet + failedOdds === 0
        ? 'no design temperature has a unit with a life-cycle cost'
        : `no design temperature meets it (${failedUnmet} miss the unmet-hours limit, ${failedOdds} the odds limit)`;
    return { index: null, reason: `The rule — ${words} — picks nothing: ${why}.` };
  }
  const picked = rows[best];
  return {
    index: best,
    reason: `The rule — ${words} — picks the point marked “${picked?.label ?? ''}”: of the design temperatures within its limits, this one has the lowest life-cycle cost.`,
  };
}
