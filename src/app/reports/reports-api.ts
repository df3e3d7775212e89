import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import { z } from 'zod';
import {
  linkCreatedSchema,
  reportListSchema,
  reportSchema,
  reportViewSchema,
  type Report,
  type ReportInput,
  type ReportView,
} from '@shared/reports/report-schemas';

/** Client reports of a project: compose, share by link or e-mail, preview; and the public view by token. */
@Injectable({ providedIn: 'root' })
export class ReportsApi {
  private readonly http = inject(HttpClient);

  private base(projectId: string): string {
    return `/api/v1/projects/${projectId}/reports`;
  }

  async list(projectId: string, scenarioId?: string): Promise<Report[]> {
    const params: Record<string, string> = scenarioId ? { scenarioId } : {};
    return reportListSchema.parse(await firstValueFrom(this.http.get<unknown>(this.base(projectId), { params })));
  }

  async get(projectId: string, id: string): Promise<Report> {
    return reportSchema.parse(await firstValueFrom(this.http.get<unknown>(`${this.base(projectId)}/${id}`)));
  }

  async create(projectId: string, input: ReportInput): Promise<Report> {
    return reportSchema.parse(await firstValueFrom(this.http.post<unknown>(this.base(projectId), input)));
  }

  async remove(projectId: string, id: string): Promise<void> {
    await firstValueFrom(this.http.delete(`${this.base(projectId)}/${id}`));
  }

  async preview(projectId: string, id: string): Promise<ReportView> {
    return reportViewSchema.parse(await firstValueFrom(this.http.get<unknown>(`${this.base(projectId)}/${id}/view`)));
  }

  /** A new link; its address (with the token) is shown only in this answer. */
  async createLink(projectId: string, id: string, expiresInDays: number): Promise<z.infer<typeof linkCreatedSchema>> {
    return linkCreatedSchema.parse(
      await firstValueFrom(this.http.post<unknown>(`${this.base(projectId)}/${id}/links`, { expiresInDays })),
    );
  }

  async revokeLink(projectId: string, id: string, linkId: string): Promise<Report> {
    return reportSchema.parse(
      await firstValueFrom(this.http.delete<unknown>(`${this.base(projectId)}/${id}/links/${linkId}`)),
    );
  }

  /** 502 `send_failed` when the e-mail could not be sent (the attempt is recorded and can be retried). */
  async send(
    projectId: string,
    id: string,
    input: { to: string; message: string; expiresInDays: number },
  ): Promise<Report> {
    return reportSchema.parse(
      await firstValueFrom(this.http.post<unknown>(`${this.base(projectId)}/${id}/send`, input)),
    );
  }

  async retry(projectId: string, id: string, sendId: string): Promise<Report> {
    return reportSchema.parse(
      await firstValueFrom(this.http.post<unknown>(`${this.base(projectId)}/${id}/sends/${sendId}/retry`, {})),
    );
  }

  /** GET /api/v1/public/reports/:token: 410 for an expired or withdrawn link, 404 for an unknown one. */
  async publicView(token: string): Promise<ReportView> {
    return reportViewSchema.parse(
      await firstValueFrom(this.http.get<unknown>(`/api/v1/public/reports/${encodeURIComponent(token)}`)),
    );
  }
}
