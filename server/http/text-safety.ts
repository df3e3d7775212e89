/**
 * Every JSON body and query string of the API passes the shared text check (`@shared/api/safe-text`)
 * before any router sees it: a NUL or a lone surrogate anywhere is a 400 naming the field, so that
 * no such character reaches the database, a PDF, a CSV or an e-mail.
 */
import type { RequestHandler } from 'express';
import { safeRequestTextSchema } from '@shared/api/safe-text';

export const textSafety: RequestHandler = (req, _res, next) => {
  const body = safeRequestTextSchema.safeParse(req.body);
  if (!body.success) return next(body.error);
  const query = safeRequestTextSchema.safeParse(req.query);
  if (!query.success) return next(query.error);
  next();
};
