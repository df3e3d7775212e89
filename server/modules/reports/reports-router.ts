/**
 * Client reports of a project (`/api/v1/projects/:projectId/reports…`): composed by designers and
 * owners from a scenario, previewed, shared by links and sent by e-mail. The homeowner's side, read
 * by the link's token without an account, is `public-reports-router.ts`.
 */
import { Router, type Response } from 'express';
import { z } from 'zod';
import { linkInputSchema, reportInputSchema, sendInputSchema, type ReportView } from '@shared/reports/report-schemas';
import { authorize, orgContext } from '../../http/authorize';
import * as reports from './reports-service';

const projectParam = z.object({ projectId: z.uuid('Unknown project') });
const reportParams = projectParam.extend({ reportId: z.uuid('Unknown report') });
const listQuery = z.strictObject({ scenarioId: z.uuid('Unknown scenario').optional() });

/** A report's PDF, shown in the browser (inline) under a name from its title. */
export async function sendPdf(
  deps: reports.ReportsDeps,
  res: Response,
  row: reports.ReportRow,
  view: ReportView,
): Promise<void> {
  const { pdf, fileName } = await reports.pdfOf(deps, row, view);
  res.type('application/pdf').set('Content-Disposition', `inline; filename="${fileName}"`).send(pdf);
}

/** A send's answer: 201 with the report, or 502 with the report and the recorded failure. */
function sendAnswer(res: Response, to: string, outcome: reports.SendOutcome): void {
  if (outcome.error) {
    res.status(502).json({
      error: {
        code: 'send_failed',
        message: `The e-mail to ${to} could not be sent (${outcome.error}). It is recorded; try again.`,
        details: [],
      },
      report: outcome.report,
      sendId: outcome.sendId,
    });
    return;
  }
  res.status(201).json(outcome.report);
}

export function reportsRouter(deps: reports.ReportsDeps): Router {
  const { db } = deps;
  const router = Router();

  router.get('/projects/:projectId/reports', authorize(db, 'org:read'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const { scenarioId } = listQuery.parse(req.query);
    res.json(await reports.listReports(db, orgContext(req).organizationId, projectId, scenarioId));
  });

  router.post('/projects/:projectId/reports', authorize(db, 'project:write'), async (req, res) => {
    const { projectId } = projectParam.parse(req.params);
    const input = reportInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const created = await reports.createReport(deps, organizationId, user.id, projectId, input);
    res.status(201).location(`/api/v1/projects/${projectId}/reports/${created.id}`).json(created);
  });

  router.get('/projects/:projectId/reports/:reportId', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    res.json(await reports.getReport(db, orgContext(req).organizationId, projectId, reportId));
  });

  router.delete('/projects/:projectId/reports/:reportId', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    await reports.deleteReport(db, orgContext(req).organizationId, projectId, reportId);
    res.status(204).end();
  });

  const previewUrls = (projectId: string, reportId: string) => ({
    pdfUrl: `/api/v1/projects/${projectId}/reports/${reportId}/pdf`,
    logoUrl: '/api/v1/organization/logo',
  });

  /** Exactly what the client will see, for the signed-in preview. */
  router.get('/projects/:projectId/reports/:reportId/view', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const row = await reports.findReport(db, orgContext(req).organizationId, projectId, reportId);
    res.json(await reports.viewOf(deps, row, previewUrls(projectId, reportId), null));
  });

  router.get('/projects/:projectId/reports/:reportId/pdf', authorize(db, 'org:read'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const row = await reports.findReport(db, orgContext(req).organizationId, projectId, reportId);
    await sendPdf(deps, res, row, await reports.viewOf(deps, row, previewUrls(projectId, reportId), null));
  });

  router.post('/projects/:projectId/reports/:reportId/links', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const { expiresInDays } = linkInputSchema.parse(req.body ?? {});
    const { organizationId, user } = orgContext(req);
    res
      .status(201)
      .json(await reports.shareReport(deps, req, organizationId, user.id, projectId, reportId, expiresInDays));
  });

  router.delete(
    '/projects/:projectId/reports/:reportId/links/:linkId',
    authorize(db, 'project:write'),
    async (req, res) => {
      const { projectId, reportId, linkId } = reportParams.extend({ linkId: z.uuid('Unknown link') }).parse(req.params);
      const { organizationId, user } = orgContext(req);
      res.json(await reports.revokeLink(deps, req, organizationId, user.id, projectId, reportId, linkId));
    },
  );

  router.post('/projects/:projectId/reports/:reportId/send', authorize(db, 'project:write'), async (req, res) => {
    const { projectId, reportId } = reportParams.parse(req.params);
    const input = sendInputSchema.parse(req.body);
    const { organizationId, user } = orgContext(req);
    const row = await reports.findReport(db, organizationId, projectId, reportId);
    const sender = { organizationId, userId: user.id, name: user.name, email: user.email };
    sendAnswer(res, input.to, await reports.sendReport(deps, req, sender, row, input));
  });

  router.post(
    '/projects/:projectId/reports/:reportId/sends/:sendId/retry',
    authorize(db, 'project:write'),
    async (req, res) => {
      const { projectId, reportId, sendId } = reportParams.extend({ sendId: z.uuid('Unknown send') }).parse(req.params);
      const { organizationId, user } = orgContext(req);
      const row = await reports.findReport(db, organizationId, projectId, reportId);
      const input = await reports.previousSend(db, row, sendId);
      const sender = { organizationId, userId: user.id, name: user.name, email: user.email };
      sendAnswer(res, input.to, await reports.sendReport(deps, req, sender, row, input));
    },
  );

  return router;
}
