/**
 * Client reports: composed by designers and owners from a scenario (`/api/v1/projects/:projectId/reports…`),
 * shared by expiring, revocable links and by e-mail, and read without an account through
 * `/api/v1/public/reports/:token` (page data, PDF, the firm's logo).
 */
import { Router, type Request, type Response } from 'express';
import type { Knex } from 'knex';
import { z } from 'zod';
import type { Building } from '@shared/building/building-schemas';
import {
  linkInputSchema,
  reportInputSchema,
  sendInputSchema,
  type Report,
  type ReportFigure,
  type ReportLink,
  type ReportSend,
  type ReportView,
} from '@shared/reports/report-schemas';
import type { UnitSystem } from '@shared/units/units';
import type { Config } from '../../config';
import { authorize, orgContext } from '../../http/authorize';
import { HttpError } from '../../http/http-error';
import { consume } from '../../http/rate-limit-store';
import type { ReportSendLimits } from '../../http/security';
import type { Mailer } from '../../mail/mailer';
import { reportMail } from '../../mail/messages';
import type { SweepPool } from '../scenarios/sweep-pool';
import { scenarioSweep, type ScenarioRow } from '../scenarios/sweep-service';
import { audit } from '../audit/audit';
import { loadLogo, sendLogo } from './logo-router';
import type { PdfPool } from './pdf-pool';
import { hashReportToken, newReportToken, verifyReportToken } from './report-tokens';
import { buildReportView } from './report-view';

const FORMER = 'A former member';
const DAY_MS = 86_400_000;

interface ReportRow {
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
  created_by_name: string | null;
  created_by_email: string | null;
  contact_phone: string;
  scenario_name: string;
  scenario_frozen_at: Date | null;
}

interface LinkRow {
  id: string;
  report_id: string;
  created_at: Date;
  expires_at: Date;
  revoked_at: Date | null;
}

const linkStatus = (l: LinkRow, now = Date.now()): ReportLink['status'] =>
  l.revoked_at ? 'revoked' : l.expires_at.getTime() <= now ? 'expired' : 'active';

const toLink = (l: LinkRow): ReportLink => ({
  id: l.id,
  createdAt: l.created_at.toISOString(),
  expiresAt: l.expires_at.toISOString(),
  revokedAt: l.revoked_at ? l.revoked_at.toISOString() : null,
  status: linkStatus(l),
});

const projectParam = z.object({ projectId: z.uuid('Unknown project') });
const reportParams = projectParam.extend({ reportId: z.uuid('Unknown report') });
const listQuery = z.strictObject({ scenarioId: z.uuid('Unknown scenario').optional() });
const reportNotFound = () => new HttpError(404, 'not_found', 'That report was not found');

/** What a send's record says until its e-mail is known to have left (it stays so only if the server stopped meanwhile). */
const SEND_INTERRUPTED = 'The sending was interrupted; check with the client before sending again';

export function reportsRouter(deps: { db: Knex; pool: SweepPool; pdfPool: PdfPool; config: Config; mailer: Mailer; sendLimits: ReportSendLimits }): Router {
  const { db, pool, pdfPool, config, mailer, sendLimits } = deps;
  const router = Router();

  function reportQuery(organizationId: string) {
    return db('reports as r')
      .join('scenarios as s', 's.id', 'r.scenario_id')
      .leftJoin('users as u', 'u.id', 'r.created_by')
      .where('r.organization_id', organizationId)
      .select<ReportRow[]>('r.*', 'u.name as created_by_name', 'u.email as created_by_email', 's.name as scenario_name', 's.frozen_at as scenario_frozen_at');
  }

  async function toReports(rows: ReportRow[]): Promise<Report[]> {
    const ids = rows.map((r) => r.id);
    const links = ids.length ? await db('report_links').whereIn('report_id', ids).orderBy('created_at', 'desc').select<LinkRow[]>('*') : [];
    const sends = ids.length
      ? await db('report_sends').whereIn('report_id', ids).orderBy('sent_at', 'desc').select<
          { id: string; report_id: string; link_id: string | null; recipient: string; status: ReportSend['status']; error: string | null; sent_at: Date }[]
        >('*')
      : [];
    return rows.map((r) => ({
      id: r.id,
      projectId: r.project_id,
      scenarioId: r.scenario_id,
      scenarioName: r.scenario_name,
      scenarioFrozen: r.scenario_frozen_at !== null,
      title: r.title,
      note: r.note,
      contactPhone: r.contact_phone,
      points: r.points,
      figures: r.figures,
      unitSystem: r.unit_system,
      createdByName: r.created_by_name ?? FORMER,
      createdAt: r.created_at.toISOString(),
      links: links.filter((l) => l.report_id === r.id).map(toLink),
      sends: sends
        .filter((s) => s.report_id === r.id)
        .map((s) => ({ id: s.id, recipient: s.recipient, status: s.status, error: s.error, sentAt: s.sent_at.toISOString(), linkId: s.link_id })),
    }));
  }

  async function findReport(organizationId: string, projectId: string, reportId: string): Promise<ReportRow> {
    const [row] = await reportQuery(organizationId).andWhere({ 'r.id': reportId, 'r.project_id': projectId });
    if (!row) throw reportNotFound();
    return row;
  }

  /** The client's view of a report, with the sweep of its scenario (frozen, cached or computed now). */
  async function viewOf(row: ReportRow, urls: { pdfUrl: string; logoUrl: string }, expiresAt: Date | null): Promise<ReportView> {
    const scenario = await db('scenarios').where({ id: row.scenario_id }).first<ScenarioRow | undefined>('*');
    if (!scenario) throw reportNotFound();
    const sweep = await scenarioSweep(db, pool, config.databaseUrl, scenario);
    if (!sweep) throw new Error('sweep missing after a run');
    const project = await db('projects')
      .where({ id: row.project_id })
      .first<{ name: string; client_name: string; site_address: string; building: Building | null }>('name', 'client_name', 'site_address', 'building');
    const org = await db('organizations').where({ id: row.organization_id }).first<{ name: string }>('name');
    const logo: unknown = await db('organization_logos').where({ organization_id: row.organization_id }).first('organization_id');
    return buildReportView({
      report: { title: row.title, note: row.note, points: row.points, figures: row.figures, unitSystem: row.unit_system, createdAt: row.created_at },
      frozenAt: scenario.frozen_at,
      sweep,
      project: { name: project.name, clientName: project.client_name, siteAddress: project.site_address, building: project.building },
      firmName: org.name,
      contact: { name: row.created_by_name ?? org.name, email: row.created_by_email ?? '', phone: row.contact_phone },
      logoUrl: logo ? urls.logoUrl : null,
      pdfUrl: urls.pdfUrl,
      expiresAt,
    });
  }

  async function sendPdf(res: Response, row: ReportRow, view: ReportView): Promise<void> {
    const pdf = await pdfPool.render(view, await loadLogo(db, row.organization_id));
    const name = view.title.replace(/[^\w.-]+/g, '-').replace(/-+/g, '-').slice(0, 80) || 'report';
    res.type('application/pdf').set('Content-Disposition', `inline; filename="${name}.pdf"`).send(pdf);
  }

  async function createLink(reportId: string, userId: string, days: number, conn: Knex = db): Promise<{ link: ReportLink; url: string; id: string }> {
    const { token, hash } = newReportToken(config.sessionSecret);
    const [row] = await conn('report_links')
      .insert({ report_id: reportId, token_hash: hash, expires_at: new Date(Date.now() + days * DAY_MS), created_by: userId })
      .returning<LinkRow[]>('*');
    if (!row) throw new Error('link not created');
    return { link: toLink(row), url: `${config.publicUrl}/r/${token}`, id: row.id };
  }

  async function deliver(
    row: ReportRow,
    organizationName: string,
    sender: { name: string; email: string },
    input: { to: string; message: string; expiresInDays: number },
    userId: string,
  ) {
    // The link, the send's record and the audit entry are written together before the e-mail goes
    // out: a failure before it leaves nothing behind, and nothing after it can make a retry send twice.
    const { url, linkId, link, sendId } = await db.transaction(async (trx) => {
      const made = await createLink(row.id, userId, input.expiresInDays, trx);
      await audit(trx, null, { type: 'report_link_created', organizationId: row.organization_id, userId, detail: { report: row.id, title: row.title, link: made.id, emailedTo: input.to } });
      const [send] = await trx('report_sends')
        .insert({ report_id: row.id, link_id: made.id, recipient: input.to, message: input.message, status: 'failed', error: SEND_INTERRUPTED, sent_by: userId })
        .returning<{ id: string }[]>('id');
      if (!send) throw new Error('send not recorded');
      return { url: made.url, linkId: made.id, link: made.link, sendId: send.id };
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
      await db('report_links').where({ id: linkId }).update({ revoked_at: db.fn.now() });
    }
    await db('report_sends').where({ id: sendId }).update({ status: error ? 'failed' : 'sent', error });
    return { sendId, error };
  }

  router.get('/projects/:projectId/reports', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { scenarioId } = listQuery.parse(req.query);
    const { organizationId } = orgContext(req);
    const project: unknown = await db('projects').where({ id: projectId, organization_id: organizationId }).first('id');
    if (!project) throw new HttpError(404, 'not_found', 'That project was not found');
    const q = reportQuery(organizationId).andWhere('r.project_id', projectId).orderBy('r.created_at', 'desc');
    res.json(await toReports(await (scenarioId ? q.andWhere('r.scenario_id', scenarioId) : q)));
  });

  router.post('/projects/:projectId/reports', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const input = reportInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const scenario = await db('scenarios')
      .where({ id: input.scenarioId, project_id: projectId, organization_id: organizationId })
      .first<ScenarioRow | undefined>('*');
    if (!scenario) throw new HttpError(404, 'not_found', 'That scenario was not found', [{ path: 'scenarioId', message: 'Choose a scenario of this project' }]);
    // The scenario must sweep (422 with what is missing otherwise) before a report can show it.
    await scenarioSweep(db, pool, config.databaseUrl, scenario);
    const [row] = await db('reports')
      .insert({
        organization_id: organizationId,
        project_id: projectId,
        scenario_id: scenario.id,
        title: input.title,
        note: input.note,
        contact_phone: input.contactPhone,
        points: JSON.stringify(input.points),
        figures: JSON.stringify(input.figures),
        unit_system: input.unitSystem,
        created_by: user.id,
      })
      .returning<{ id: string }[]>('id');
    const [created] = await toReports([await findReport(organizationId, projectId, row?.id ?? '')]);
    res.status(201).location(`/api/v1/projects/${projectId}/reports/${created?.id ?? ''}`).json(created);
  });

  router.get('/projects/:projectId/reports/:reportId', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const [report] = await toReports([await findReport(orgContext(req).organizationId, projectId, reportId)]);
    res.json(report);
  });

  router.delete('/projects/:projectId/reports/:reportId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const n = await db('reports').where({ id: reportId, project_id: projectId, organization_id: orgContext(req).organizationId }).delete();
    if (!n) throw reportNotFound();
    res.status(204).end();
  });

  const previewUrls = (projectId: string, reportId: string) => ({
    pdfUrl: `/api/v1/projects/${projectId}/reports/${reportId}/pdf`,
    logoUrl: '/api/v1/organization/logo',
  });

  /** Exactly what the client will see, for the signed-in preview. */
  router.get('/projects/:projectId/reports/:reportId/view', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const row = await findReport(orgContext(req).organizationId, projectId, reportId);
    res.json(await viewOf(row, previewUrls(projectId, reportId), null));
  });

  router.get('/projects/:projectId/reports/:reportId/pdf', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const row = await findReport(orgContext(req).organizationId, projectId, reportId);
    await sendPdf(res, row, await viewOf(row, previewUrls(projectId, reportId), null));
  });

  router.post('/projects/:projectId/reports/:reportId/links', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const { expiresInDays } = linkInputSchema.parse(req.body ?? {});
    const { organizationId, user } = orgContext(req);
    const row = await findReport(organizationId, projectId, reportId);
    const { link, url } = await createLink(row.id, user.id, expiresInDays);
    await audit(db, req, { type: 'report_link_created', organizationId, userId: user.id, detail: { report: row.id, title: row.title, link: link.id } });
    res.status(201).json({ link, url });
  });

  router.delete('/projects/:projectId/reports/:reportId/links/:linkId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, reportId, linkId } = reportParams.extend({ linkId: z.uuid('Unknown link') }).parse(req.params);
    const row = await findReport(orgContext(req).organizationId, projectId, reportId);
    const n = await db('report_links').where({ id: linkId, report_id: row.id }).whereNull('revoked_at').update({ revoked_at: db.fn.now() });
    if (n) await audit(db, req, { type: 'report_link_revoked', organizationId: row.organization_id, userId: orgContext(req).user.id, detail: { report: row.id, title: row.title, link: linkId } });
    if (!n) {
      const exists: unknown = await db('report_links').where({ id: linkId, report_id: row.id }).first('id');
      if (!exists) throw new HttpError(404, 'not_found', 'That link was not found');
    }
    const [report] = await toReports([row]);
    res.json(report);
  });

  async function sendAnswer(req: Request, res: Response, row: ReportRow, input: { to: string; message: string; expiresInDays: number }) {
    const { organizationId, user } = orgContext(req);
    // Mail abuse: a limit per organisation and one per recipient (from every organisation), 429 past them.
    await consume(sendLimits.perOrganization, organizationId);
    await consume(sendLimits.perRecipient, input.to.trim().toLowerCase());
    const org = await db('organizations').where({ id: organizationId }).first<{ name: string }>('name');
    const { sendId, error } = await deliver(row, org.name, { name: user.name, email: user.email }, input, user.id);
    await audit(db, req, { type: 'report_sent', organizationId, userId: user.id, detail: { report: row.id, title: row.title, to: input.to, send: sendId, status: error ? 'failed' : 'sent' } });
    const [report] = await toReports([row]);
    if (error) {
      res.status(502).json({
        error: { code: 'send_failed', message: `The e-mail to ${input.to} could not be sent (${error}). It is recorded; try again.`, details: [] },
        report,
        sendId,
      });
      return;
    }
    res.status(201).json(report);
  }

  router.post('/projects/:projectId/reports/:reportId/send', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const input = sendInputSchema.parse(req.body);
    const row = await findReport(orgContext(req).organizationId, projectId, reportId);
    await sendAnswer(req, res, row, input);
  });

  router.post('/projects/:projectId/reports/:reportId/sends/:sendId/retry', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, reportId, sendId } = reportParams.extend({ sendId: z.uuid('Unknown send') }).parse(req.params);
    const row = await findReport(orgContext(req).organizationId, projectId, reportId);
    const previous = await db('report_sends')
      .where({ id: sendId, report_id: row.id })
      .first<{ recipient: string; message: string; link_id: string | null } | undefined>('recipient', 'message', 'link_id');
    if (!previous) throw new HttpError(404, 'not_found', 'That e-mail was not found');
    await sendAnswer(req, res, row, { to: previous.recipient, message: previous.message, expiresInDays: 30 });
  });

  // --- Public: no account, only the link's token -------------------------------------------

  async function byToken(token: string): Promise<{ row: ReportRow; link: LinkRow }> {
    if (!verifyReportToken(config.sessionSecret, token)) throw new HttpError(404, 'not_found', 'This report link is not valid');
    const link = await db('report_links').where({ token_hash: hashReportToken(token) }).first<LinkRow | undefined>('*');
    if (!link) throw new HttpError(404, 'not_found', 'This report link is not valid');
    const status = linkStatus(link);
    if (status === 'revoked') throw new HttpError(410, 'link_revoked', 'This report link was withdrawn by the contractor. Ask them for a new one.');
    if (status === 'expired') throw new HttpError(410, 'link_expired', 'This report link has expired. Ask the contractor for a new one.');
    const report = await db('reports').where({ id: link.report_id }).first<{ organization_id: string; project_id: string } | undefined>('organization_id', 'project_id');
    if (!report) throw new HttpError(404, 'not_found', 'This report link is not valid');
    const row = await findReport(report.organization_id, report.project_id, link.report_id);
    return { row, link };
  }

  const tokenParam = z.object({ token: z.string().max(200) });
  const publicUrls = (token: string) => ({ pdfUrl: `/api/v1/public/reports/${token}/pdf`, logoUrl: `/api/v1/public/reports/${token}/logo` });

  router.get('/public/reports/:token', async (req, res) => {
    const { token } = tokenParam.parse(req.params);
    const { row, link } = await byToken(token);
    res.set('Cache-Control', 'no-store').json(await viewOf(row, publicUrls(token), link.expires_at));
  });

  router.get('/public/reports/:token/pdf', async (req, res) => {
    const { token } = tokenParam.parse(req.params);
    const { row, link } = await byToken(token);
    res.set('Cache-Control', 'no-store');
    await sendPdf(res, row, await viewOf(row, publicUrls(token), link.expires_at));
  });

  router.get('/public/reports/:token/logo', async (req, res) => {
    const { token } = tokenParam.parse(req.params);
    const { row } = await byToken(token);
    const logo = await loadLogo(db, row.organization_id);
    if (!logo) throw new HttpError(404, 'not_found', 'This firm has no logo');
    sendLogo(res, logo);
  });

  return router;
}
