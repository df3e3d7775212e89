/**
 * Client reports: composed by designers and owners from a scenario, shared by expiring, revocable
 * links and by e-mail, and read without an account by the link's token (page data, PDF, logo).
 */
import type { Knex } from 'knex';
import type { Request } from 'express';
import type { z } from 'zod';
import type { Report, ReportLink, reportInputSchema, ReportView } from '@shared/reports/report-schemas';
import type { Config } from '../../config';
import { HttpError } from '../../http/http-error';
import { consume } from '../../http/rate-limit-store';
import type { ReportSendLimits } from '../../http/security';
import type { Mailer } from '../../mail/mailer';
import { reportMail } from '../../mail/messages';
import { audit } from '../audit/audit-service';
import { contactsByIds } from '../auth/users-repo';
import { hasLogo, loadLogo, type StoredLogo } from '../orgs/logo-service';
import { organizationName } from '../orgs/orgs-repo';
import { findReportFacts, projectInOrganization } from '../projects/projects-service';
import { findScenarioRow, scenarioLabels } from '../scenarios/scenarios-service';
import type { SweepPool } from '../scenarios/sweep-pool';
import { scenarioSweep } from '../scenarios/sweep-service';
import type { PdfPool } from './pdf-pool';
import * as repo from './reports-repo';
import { hashReportToken, newReportToken, verifyReportToken } from './report-tokens';
import { buildReportView } from './report-view';

export type { ReportRow } from './reports-repo';

export interface ReportsDeps {
  db: Knex;
  pool: SweepPool;
  pdfPool: PdfPool;
  config: Config;
  mailer: Mailer;
  sendLimits: ReportSendLimits;
}

type ReportInput = z.output<typeof reportInputSchema>;

const FORMER = 'A former member';
const DAY_MS = 86_400_000;

/** What a send's record says until its e-mail is known to have left (it stays so only if the server stopped meanwhile). */
const SEND_INTERRUPTED = 'The sending was interrupted; check with the client before sending again';

export const reportNotFound = () => new HttpError(404, 'not_found', 'That report was not found');

/** The reports as the API shows them, with their scenario's name, their author, links and sends. */
async function toReports(db: Knex, rows: repo.ReportRow[]): Promise<Report[]> {
  const ids = rows.map((r) => r.id);
  const [links, sends, scenarios, people] = await Promise.all([
    repo.linksOf(db, ids),
    repo.sendsOf(db, ids),
    scenarioLabels(
      db,
      rows.map((r) => r.scenario_id),
    ),
    contactsByIds(
      db,
      rows.flatMap((r) => (r.created_by ? [r.created_by] : [])),
    ),
  ]);
  return rows.flatMap((r) => {
    const scenario = scenarios.get(r.scenario_id);
    if (!scenario) return [];
    return [
      {
        id: r.id,
        projectId: r.project_id,
        scenarioId: r.scenario_id,
        scenarioName: scenario.name,
        scenarioFrozen: scenario.frozenAt !== null,
        title: r.title,
        note: r.note,
        contactPhone: r.contact_phone,
        points: r.points,
        figures: r.figures,
        unitSystem: r.unit_system,
        createdByName: (r.created_by ? people.get(r.created_by)?.name : undefined) ?? FORMER,
        createdAt: r.created_at.toISOString(),
        links: links.filter((l) => l.report_id === r.id).map(repo.toLink),
        sends: sends.filter((s) => s.report_id === r.id).map(repo.toSend),
      },
    ];
  });
}

async function toReport(db: Knex, row: repo.ReportRow): Promise<Report> {
  const [report] = await toReports(db, [row]);
  if (!report) throw reportNotFound();
  return report;
}

/** The report of the project in the organisation, or 404. */
export async function findReport(
  db: Knex,
  organizationId: string,
  projectId: string,
  reportId: string,
): Promise<repo.ReportRow> {
  const row = await repo.findReport(db, organizationId, projectId, reportId);
  if (!row) throw reportNotFound();
  return row;
}

export async function listReports(
  db: Knex,
  organizationId: string,
  projectId: string,
  scenarioId: string | undefined,
): Promise<Report[]> {
  await projectInOrganization(db, organizationId, projectId);
  return toReports(db, await repo.listReports(db, organizationId, projectId, scenarioId));
}

export async function getReport(
  db: Knex,
  organizationId: string,
  projectId: string,
  reportId: string,
): Promise<Report> {
  return toReport(db, await findReport(db, organizationId, projectId, reportId));
}

export async function createReport(
  deps: ReportsDeps,
  organizationId: string,
  userId: string,
  projectId: string,
  input: ReportInput,
): Promise<Report> {
  const { db, pool, config } = deps;
  const scenario = await findScenarioRow(db, {
    id: input.scenarioId,
    project_id: projectId,
    organization_id: organizationId,
  });
  if (!scenario)
    throw new HttpError(404, 'not_found', 'That scenario was not found', [
      { path: 'scenarioId', message: 'Choose a scenario of this project' },
    ]);
  // The scenario must sweep (422 with what is missing otherwise) before a report can show it.
  await scenarioSweep(db, pool, config.databaseUrl, scenario);
  const id = await repo.insertReport(db, {
    organizationId,
    projectId,
    scenarioId: scenario.id,
    title: input.title,
    note: input.note,
    contactPhone: input.contactPhone,
    points: input.points,
    figures: input.figures,
    unitSystem: input.unitSystem,
    createdBy: userId,
  });
  return getReport(db, organizationId, projectId, id);
}

export async function deleteReport(
  db: Knex,
  organizationId: string,
  projectId: string,
  reportId: string,
): Promise<void> {
  if (!(await repo.deleteReport(db, organizationId, projectId, reportId))) throw reportNotFound();
}

/** The client's view of a report, with the sweep of its scenario (frozen, cached or computed now). */
export async function viewOf(
  deps: ReportsDeps,
  row: repo.ReportRow,
  urls: { pdfUrl: string; logoUrl: string },
  expiresAt: Date | null,
): Promise<ReportView> {
  const { db, pool, config } = deps;
  const scenario = await findScenarioRow(db, { id: row.scenario_id });
  if (!scenario) throw reportNotFound();
  const sweep = await scenarioSweep(db, pool, config.databaseUrl, scenario);
  if (!sweep) throw new Error('sweep missing after a run');
  const project = await findReportFacts(db, row.project_id);
  if (!project) throw reportNotFound();
  const firmName = await organizationName(db, row.organization_id);
  const author = row.created_by ? (await contactsByIds(db, [row.created_by])).get(row.created_by) : undefined;
  const withLogo = await hasLogo(db, row.organization_id);
  return buildReportView({
    report: {
      title: row.title,
      note: row.note,
      points: row.points,
      figures: row.figures,
      unitSystem: row.unit_system,
      createdAt: row.created_at,
    },
    frozenAt: scenario.frozen_at,
    sweep,
    project: {
      name: project.name,
      clientName: project.client_name,
      siteAddress: project.site_address,
      building: project.building,
    },
    firmName,
    contact: { name: author?.name ?? firmName, email: author?.email ?? '', phone: row.contact_phone },
    logoUrl: withLogo ? urls.logoUrl : null,
    pdfUrl: urls.pdfUrl,
    expiresAt,
  });
}

/** The report's PDF, with a file name from its title. */
export async function pdfOf(
  deps: ReportsDeps,
  row: repo.ReportRow,
  view: ReportView,
): Promise<{ pdf: Buffer; fileName: string }> {
  const pdf = await deps.pdfPool.render(view, await loadLogo(deps.db, row.organization_id));
  const name =
    view.title
      .replace(/[^\w.-]+/g, '-')
      .replace(/-+/g, '-')
      .slice(0, 80) || 'report';
  return { pdf, fileName: `${name}.pdf` };
}

async function createLink(
  deps: ReportsDeps,
  reportId: string,
  userId: string,
  days: number,
  conn: Knex,
): Promise<{ link: ReportLink; url: string; id: string }> {
  const { token, hash } = newReportToken(deps.config.sessionSecret);
  const row = await repo.insertLink(conn, {
    reportId,
    tokenHash: hash,
    expiresAt: new Date(Date.now() + days * DAY_MS),
    createdBy: userId,
  });
  return { link: repo.toLink(row), url: `${deps.config.publicUrl}/r/${token}`, id: row.id };
}

/** A new share link of the report (audited). */
export async function shareReport(
  deps: ReportsDeps,
  req: Request,
  organizationId: string,
  userId: string,
  projectId: string,
  reportId: string,
  expiresInDays: number,
): Promise<{ link: ReportLink; url: string }> {
  const row = await findReport(deps.db, organizationId, projectId, reportId);
  const { link, url } = await createLink(deps, row.id, userId, expiresInDays, deps.db);
  await audit(deps.db, req, {
    type: 'report_link_created',
    organizationId,
    userId,
    detail: { report: row.id, title: row.title, link: link.id },
  });
  return { link, url };
}

/** Withdraws a link (audited when it was still usable); 404 for a link the report does not have. */
export async function revokeLink(
  deps: ReportsDeps,
  req: Request,
  organizationId: string,
  userId: string,
  projectId: string,
  reportId: string,
  linkId: string,
): Promise<Report> {
  const { db } = deps;
  const row = await findReport(db, organizationId, projectId, reportId);
  const revoked = await repo.revokeLink(db, linkId, row.id);
  if (revoked)
    await audit(db, req, {
      type: 'report_link_revoked',
      organizationId: row.organization_id,
      userId,
      detail: { report: row.id, title: row.title, link: linkId },
    });
  if (!revoked && !(await repo.linkExists(db, row.id, linkId)))
    throw new HttpError(404, 'not_found', 'That link was not found');
  return toReport(db, row);
}

async function deliver(
  deps: ReportsDeps,
  row: repo.ReportRow,
  organizationName: string,
  sender: { name: string; email: string },
  input: { to: string; message: string; expiresInDays: number },
  userId: string,
) {
  const { db, mailer } = deps;
  // The link, the send's record and the audit entry are written together before the e-mail goes
  // out: a failure before it leaves nothing behind, and nothing after it can make a retry send twice.
  const { url, linkId, link, sendId } = await db.transaction(async (trx) => {
    const made = await createLink(deps, row.id, userId, input.expiresInDays, trx);
    await audit(trx, null, {
      type: 'report_link_created',
      organizationId: row.organization_id,
      userId,
      detail: { report: row.id, title: row.title, link: made.id, emailedTo: input.to },
    });
    const id = await repo.insertSend(trx, {
      reportId: row.id,
      linkId: made.id,
      recipient: input.to,
      message: input.message,
      status: 'failed',
      error: SEND_INTERRUPTED,
      sentBy: userId,
    });
    return { url: made.url, linkId: made.id, link: made.link, sendId: id };
  });
  let error: string | null = null;
  try {
    await mailer.send(
      reportMail(input.to, url, {
        organizationName,
        senderName: sender.name,
        senderEmail: sender.email,
        phone: row.contact_phone,
        title: row.title,
        message: input.message,
        expiresAt: new Date(link.expiresAt),
      }),
    );
  } catch (err) {
    error = err instanceof Error ? err.message : String(err);
    // The link of a failed send was never delivered: revoke it.
    await repo.revokeLink(db, linkId);
  }
  await repo.setSendOutcome(db, sendId, error);
  return { sendId, error };
}

/** What a send answers: the report, and the failure when the e-mail could not leave (it is recorded either way). */
export interface SendOutcome {
  report: Report;
  sendId: string;
  error: string | null;
}

/** E-mails a new link of the report to the client; limited per organisation and per recipient (429 past them). */
export async function sendReport(
  deps: ReportsDeps,
  req: Request,
  sender: { organizationId: string; userId: string; name: string; email: string },
  row: repo.ReportRow,
  input: { to: string; message: string; expiresInDays: number },
): Promise<SendOutcome> {
  const { db, sendLimits } = deps;
  const { organizationId, userId } = sender;
  // Mail abuse: a limit per organisation and one per recipient (from every organisation), 429 past them.
  await consume(sendLimits.perOrganization, organizationId);
  await consume(sendLimits.perRecipient, input.to.trim().toLowerCase());
  const orgName = await organizationName(db, organizationId);
  const { sendId, error } = await deliver(
    deps,
    row,
    orgName,
    { name: sender.name, email: sender.email },
    input,
    userId,
  );
  await audit(db, req, {
    type: 'report_sent',
    organizationId,
    userId,
    detail: { report: row.id, title: row.title, to: input.to, send: sendId, status: error ? 'failed' : 'sent' },
  });
  return { report: await toReport(db, row), sendId, error };
}

/** The recipient and message of an earlier send of the report, to send again; 404 when there is none. */
export async function previousSend(
  db: Knex,
  row: repo.ReportRow,
  sendId: string,
): Promise<{ to: string; message: string; expiresInDays: number }> {
  const previous = await repo.findSend(db, row.id, sendId);
  if (!previous) throw new HttpError(404, 'not_found', 'That e-mail was not found');
  return { to: previous.recipient, message: previous.message, expiresInDays: 30 };
}

// --- Public: no account, only the link's token -------------------------------------------

/** The report and link of a token: 404 for a forged or unknown one, 410 for one withdrawn or expired. */
export async function byToken(deps: ReportsDeps, token: string): Promise<{ row: repo.ReportRow; link: repo.LinkRow }> {
  const { db, config } = deps;
  if (!verifyReportToken(config.sessionSecret, token))
    throw new HttpError(404, 'not_found', 'This report link is not valid');
  const link = await repo.findLinkByTokenHash(db, hashReportToken(token));
  if (!link) throw new HttpError(404, 'not_found', 'This report link is not valid');
  const status = repo.linkStatus(link);
  if (status === 'revoked')
    throw new HttpError(
      410,
      'link_revoked',
      'This report link was withdrawn by the contractor. Ask them for a new one.',
    );
  if (status === 'expired')
    throw new HttpError(410, 'link_expired', 'This report link has expired. Ask the contractor for a new one.');
  const row = await repo.findReportById(db, link.report_id);
  if (!row) throw new HttpError(404, 'not_found', 'This report link is not valid');
  return { row, link };
}

/** The firm's logo shown on a report, or 404. */
export async function logoOf(db: Knex, row: repo.ReportRow): Promise<StoredLogo> {
  const logo = await loadLogo(db, row.organization_id);
  if (!logo) throw new HttpError(404, 'not_found', 'This firm has no logo');
  return logo;
}

/**
 * The HTTP status the report page of a link should answer with: 200 for a working link, 410 for an
 * expired or withdrawn one, 404 for one that is forged or unknown (the page itself explains which).
 */
export async function reportLinkHttpStatus(db: Knex, secret: string, token: string): Promise<200 | 404 | 410> {
  if (!verifyReportToken(secret, token)) return 404;
  const link = await repo.findLinkByTokenHash(db, hashReportToken(token));
  if (!link) return 404;
  return repo.linkStatus(link) === 'active' ? 200 : 410;
}
