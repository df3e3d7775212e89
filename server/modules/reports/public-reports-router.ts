/**
 * The homeowner's side of a client report (`/api/v1/public/reports/:token`): page data, PDF and the
 * firm's logo, read without an account through the link's token only.
 */
import { Router } from 'express';
import { z } from 'zod';
import { sendLogo } from '../orgs/logo-router';
import { sendPdf } from './reports-router';
import * as reports from './reports-service';

const tokenParam = z.object({ token: z.string().max(200) });
const publicUrls = (token: string) => ({
  pdfUrl: `/api/v1/public/reports/${token}/pdf`,
  logoUrl: `/api/v1/public/reports/${token}/logo`,
});

export function publicReportsRouter(deps: reports.ReportsDeps): Router {
  const router = Router();

  router.get('/public/reports/:token', async (req, res) => {
    const { token } = tokenParam.parse(req.params);
    const { row, link } = await reports.byToken(deps, token);
    res.set('Cache-Control', 'no-store').json(await reports.viewOf(deps, row, publicUrls(token), link.expires_at));
  });

  router.get('/public/reports/:token/pdf', async (req, res) => {
    const { token } = tokenParam.parse(req.params);
    const { row, link } = await reports.byToken(deps, token);
    res.set('Cache-Control', 'no-store');
    await sendPdf(deps, res, row, await reports.viewOf(deps, row, publicUrls(token), link.expires_at));
  });

  router.get('/public/reports/:token/logo', async (req, res) => {
    const { token } = tokenParam.parse(req.params);
    const { row } = await reports.byToken(deps, token);
    sendLogo(res, await reports.logoOf(deps.db, row));
  });

  return router;
}
