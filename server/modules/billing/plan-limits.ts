/**
 * The organisation's plan and its limits, enforced on the server: an action over a limit answers
 * 402 `plan_limit` and changes nothing. Checks run inside the caller's transaction with the
 * organisation row locked, so two requests at once cannot both take the last place.
 */
import type { Knex } from 'knex';
import { PLANS, type PlanId, type Usage } from '@shared/billing/billing-schemas';
import { HttpError } from '../../http/http-error';
import { pendingCount } from '../orgs/invitations-repo';
import { lockOrganization, memberCount } from '../orgs/orgs-repo';
import { countActiveProjects } from '../projects/projects-service';
import { findPlan } from './billing-repo';

const PAYING = ['active', 'trialing', 'past_due'];

export async function planOf(db: Knex, organizationId: string): Promise<PlanId> {
  const row = await findPlan(db, organizationId);
  return row && PAYING.includes(row.status) ? (row.plan as PlanId) : 'starter';
}

export async function usageOf(db: Knex, organizationId: string): Promise<Usage> {
  const plan = PLANS[await planOf(db, organizationId)];
  const projects = await countActiveProjects(db, organizationId);
  const members = await memberCount(db, organizationId);
  const pending = await pendingCount(db, organizationId);
  return {
    plan: plan.id,
    planName: plan.name,
    projects: { used: projects, limit: plan.maxProjects },
    members: { used: members + pending, limit: plan.maxMembers },
  };
}

/** 402 when one more active project would pass the plan's limit. */
export async function assertCanAddProject(trx: Knex.Transaction, organizationId: string): Promise<void> {
  await lockOrganization(trx, organizationId);
  const u = await usageOf(trx, organizationId);
  if (u.projects.limit !== null && u.projects.used >= u.projects.limit) {
    throw new HttpError(
      402,
      'plan_limit',
      `The ${u.planName} plan holds ${u.projects.limit} active projects. An owner can upgrade on the Plan & billing page, or archive a project to make room.`,
      [{ path: 'projects', message: `${u.projects.used} of ${u.projects.limit} active projects used` }],
    );
  }
}

/** 402 when one more member or invitation would pass the plan's limit. */
export async function assertCanAddMember(trx: Knex.Transaction, organizationId: string): Promise<void> {
  await lockOrganization(trx, organizationId);
  const u = await usageOf(trx, organizationId);
  if (u.members.used >= u.members.limit) {
    throw new HttpError(
      402,
      'plan_limit',
      `The ${u.planName} plan holds ${u.members.limit} members, counting open invitations. An owner can upgrade on the Plan & billing page.`,
      [{ path: 'members', message: `${u.members.used} of ${u.members.limit} places used` }],
    );
  }
}
