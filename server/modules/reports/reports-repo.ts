/** The tables of client reports: `reports`, their share links and their e-mail sends, with their row mappers. */
import type { Knex } from 'knex';
import type { UnitSystem } from '@shared/units/units';
import type { ReportFigure, ReportLink, ReportSend } from '@shared/reports/report-schemas';

export const TABLES = ['reports', 'report_links', 'report_sends'] as const;

export interface ReportRow {
  id: string;
  organization_id: string;
  project_id: string;
  scenario_id: string;
  title: string;
  note: string;
  points: number[];
  figures: ReportFigure[];
  unit_system: UnitSystem;
  created_at: Date;
  created_by: string | null;
  contact_phone: string;
}

export interface LinkRow {
  id: string;
  report_id: string;
  created_at: Date;
  expires_at: Date;
  revoked_at: Date | null;
}

export interface SendRow {
  id: string;
  report_id: string;
  link_id: string | null;
  recipient: string;
  message: string;
  status: ReportSend['status'];
  error: string | null;
  sent_at: Date;
}

export const linkStatus = (l: Pick<LinkRow, 'expires_at' | 'revoked_at'>, now = Date.now()): ReportLink['status'] =>
  l.revoked_at ? 'revoked' : l.expires_at.getTime() <= now ? 'expired' : 'active';

export const toLink = (l: LinkRow): ReportLink => ({
  id: l.id,
  createdAt: l.created_at.toISOString(),
  expiresAt: l.expires_at.toISOString(),
  revokedAt: l.revoked_at ? l.revoked_at.toISOString() : null,
  status: linkStatus(l),
});

export const toSend = (s: SendRow): ReportSend => ({
  id: s.id,
  recipient: s.recipient,
  status: s.status,
  error: s.error,
  sentAt: s.sent_at.toISOString(),
  linkId: s.link_id,
});

const REPORT_COLUMNS = [
  'id',
  'organization_id',
  'project_id',
  'scenario_id',
  'title',
  'note',
  'points',
  'figures',
  'unit_system',
  'created_at',
  'created_by',
  'contact_phone',
] as const;

/** A project's reports, newest first (of one scenario when it is given). */
export function listReports(
  db: Knex,
  organizationId: string,
  projectId: string,
  scenarioId?: string,
): Promise<ReportRow[]> {
  const q = db('reports')
    .where({ organization_id: organizationId, project_id: projectId })
    .orderBy('created_at', 'desc');
  return (scenarioId ? q.andWhere('scenario_id', scenarioId) : q).select<ReportRow[]>(...REPORT_COLUMNS);
}

export async function findReport(
  db: Knex,
  organizationId: string,
  projectId: string,
  reportId: string,
): Promise<ReportRow | undefined> {
  return db('reports')
    .where({ id: reportId, project_id: projectId, organization_id: organizationId })
    .first<ReportRow | undefined>(...REPORT_COLUMNS);
}

export async function findReportById(db: Knex, reportId: string): Promise<ReportRow | undefined> {
  return db('reports')
    .where({ id: reportId })
    .first<ReportRow | undefined>(...REPORT_COLUMNS);
}

export async function insertReport(
  db: Knex,
  input: {
    organizationId: string;
    projectId: string;
    scenarioId: string;
    title: string;
    note: string;
    contactPhone: string;
    points: number[];
    figures: ReportFigure[];
    unitSystem: UnitSystem;
    createdBy: string;
  },
): Promise<string> {
  const [row] = await db('reports')
    .insert({
      organization_id: input.organizationId,
      project_id: input.projectId,
      scenario_id: input.scenarioId,
      title: input.title,
      note: input.note,
      contact_phone: input.contactPhone,
      points: JSON.stringify(input.points),
      figures: JSON.stringify(input.figures),
      unit_system: input.unitSystem,
      created_by: input.createdBy,
    })
    .returning<{ id: string }[]>('id');
  if (!row) throw new Error('report not created');
  return row.id;
}

/** Deletes a report (its links and sends go with it); false when there was none. */
export async function deleteReport(
  db: Knex,
  organizationId: string,
  projectId: string,
  reportId: string,
): Promise<boolean> {
  const n = await db('reports')
    .where({ id: reportId, project_id: projectId, organization_id: organizationId })
    .delete();
  return n > 0;
}

/** The links of these reports, newest first. */
export function linksOf(db: Knex, reportIds: readonly string[]): Promise<LinkRow[]> {
  if (reportIds.length === 0) return Promise.resolve([]);
  return db('report_links')
    .whereIn('report_id', reportIds)
    .orderBy('created_at', 'desc')
    .select<LinkRow[]>('id', 'report_id', 'created_at', 'expires_at', 'revoked_at');
}

/** The sends of these reports, newest first. */
export function sendsOf(db: Knex, reportIds: readonly string[]): Promise<SendRow[]> {
  if (reportIds.length === 0) return Promise.resolve([]);
  return db('report_sends').whereIn('report_id', reportIds).orderBy('sent_at', 'desc').select<SendRow[]>('*');
}

export async function insertLink(
  db: Knex,
  input: { reportId: string; tokenHash: string; expiresAt: Date; createdBy: string },
): Promise<LinkRow> {
  const [row] = await db('report_links')
    .insert({
      report_id: input.reportId,
      token_hash: input.tokenHash,
      expires_at: input.expiresAt,
      created_by: input.createdBy,
    })
    .returning<LinkRow[]>(['id', 'report_id', 'created_at', 'expires_at', 'revoked_at']);
  if (!row) throw new Error('link not created');
  return row;
}

export function findLinkByTokenHash(db: Knex, tokenHash: string): Promise<LinkRow | undefined> {
  return db('report_links')
    .where({ token_hash: tokenHash })
    .first<LinkRow | undefined>('id', 'report_id', 'created_at', 'expires_at', 'revoked_at');
}

export async function linkExists(db: Knex, reportId: string, linkId: string): Promise<boolean> {
  const row: unknown = await db('report_links').where({ id: linkId, report_id: reportId }).first('id');
  return Boolean(row);
}

/** Revokes a link that is not revoked yet; false when there was none to revoke. */
export async function revokeLink(db: Knex, linkId: string, reportId?: string): Promise<boolean> {
  const q = db('report_links').where({ id: linkId }).whereNull('revoked_at');
  const n = await (reportId === undefined ? q : q.andWhere({ report_id: reportId })).update({
    revoked_at: db.fn.now(),
  });
  return n > 0;
}

export async function insertSend(
  db: Knex,
  input: {
    reportId: string;
    linkId: string;
    recipient: string;
    message: string;
    status: ReportSend['status'];
    error: string | null;
    sentBy: string;
  },
): Promise<string> {
  const [send] = await db('report_sends')
    .insert({
      report_id: input.reportId,
      link_id: input.linkId,
      recipient: input.recipient,
      message: input.message,
      status: input.status,
      error: input.error,
      sent_by: input.sentBy,
    })
    .returning<{ id: string }[]>('id');
  if (!send) throw new Error('send not recorded');
  return send.id;
}

export async function setSendOutcome(db: Knex, sendId: string, error: string | null): Promise<void> {
  await db('report_sends')
    .where({ id: sendId })
    .update({ status: error ? 'failed' : 'sent', error });
}

export function findSend(
  db: Knex,
  reportId: string,
  sendId: string,
): Promise<Pick<SendRow, 'recipient' | 'message' | 'link_id'> | undefined> {
  return db('report_sends')
    .where({ id: sendId, report_id: reportId })
    .first<Pick<SendRow, 'recipient' | 'message' | 'link_id'> | undefined>('recipient', 'message', 'link_id');
}

/** The addresses the organisation's reports were e-mailed to, in lower case. */
export async function recipientAddresses(db: Knex, organizationId: string): Promise<string[]> {
  const rows = await db('report_sends as rs')
    .join('reports as r', 'r.id', 'rs.report_id')
    .where('r.organization_id', organizationId)
    .select<{ address: string }[]>(db.raw('lower(rs.recipient) as address'));
  return rows.map((r) => r.address);
}
