import { HttpClient, type HttpEvent, httpResource } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom, type Observable } from 'rxjs';
import {
  climateChartDataSchema,
  climateSiteListSchema,
  climateSiteSchema,
  recentYearsSchema,
  type ClimateSite,
  type ClimateSiteInput,
  type ClimateSitePatch,
  type UploadQueue,
  uploadQueueSchema,
} from '@shared/climate/climate-schemas';
import { AuthStore } from '../auth/auth-store';

export type UploadFormat = 'auto' | 'csv' | 'isd-lite';

/** Climate sites of the current organisation, their chart data and hourly-record uploads. */
@Injectable({ providedIn: 'root' })
export class ClimateSitesApi {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);
  private readonly url = '/api/v1/climate-sites';

  /** The list; loads again when the organisation changes (and only while `when` holds, when given). */
  listResource(when: () => boolean = () => true) {
    return httpResource(() => (this.auth.currentOrganizationId() && when() ? this.url : undefined), {
      parse: climateSiteListSchema.parse,
    });
  }

  /** One site; `id` returns undefined while there is nothing to load. */
  siteResource(id: () => string | undefined) {
    return httpResource(
      () => {
        const siteId = id();
        return siteId && this.auth.currentOrganizationId() ? `${this.url}/${siteId}` : undefined;
      },
      { parse: climateSiteSchema.parse },
    );
  }

  /** Distribution and monthly statistics of a site's stored hourly record. */
  chartDataResource(id: () => string | undefined) {
    return httpResource(
      () => {
        const siteId = id();
        return siteId ? `${this.url}/${siteId}/chart-data` : undefined;
      },
      { parse: climateChartDataSchema.parse },
    );
  }

  /** Design values of the whole record and of its latest 10 and 15 years, and the trend of the coldest hour. */
  recentYearsResource(id: () => string | undefined) {
    return httpResource(
      () => {
        const siteId = id();
        return siteId ? `${this.url}/${siteId}/recent-years` : undefined;
      },
      { parse: recentYearsSchema.parse },
    );
  }

  /** Estimates a published site's hourly record from a reference site's record (422 with the reason when refused). */
  async estimate(siteId: string, referenceSiteId: string): Promise<ClimateSite> {
    return climateSiteSchema.parse(
      await firstValueFrom(this.http.post<unknown>(`${this.url}/${siteId}/estimate`, { referenceSiteId })),
    );
  }

  async create(input: ClimateSiteInput): Promise<ClimateSite> {
    return climateSiteSchema.parse(await firstValueFrom(this.http.post<unknown>(this.url, input)));
  }

  async update(id: string, patch: ClimateSitePatch): Promise<ClimateSite> {
    return climateSiteSchema.parse(await firstValueFrom(this.http.patch<unknown>(`${this.url}/${id}`, patch)));
  }

  async remove(id: string): Promise<void> {
    await firstValueFrom(this.http.delete(`${this.url}/${id}`));
  }

  /** Sends hourly files to be parsed and checked; the events carry the upload progress. */
  upload(siteId: string, files: readonly File[], format: UploadFormat, mapping?: Record<string, string>) {
    const body = new FormData();
    body.append('format', format);
    if (mapping && Object.keys(mapping).length > 0) body.append('mapping', JSON.stringify(mapping));
    for (const file of files) body.append('files', file, file.name);
    return this.http.post<unknown>(`${this.url}/${siteId}/uploads`, body, {
      reportProgress: true,
      observe: 'events',
    }) satisfies Observable<HttpEvent<unknown>>;
  }

  /** Stores a checked upload: the observations are kept and the design conditions computed. */
  async confirmUpload(uploadId: string): Promise<ClimateSite> {
    const body = await firstValueFrom(this.http.post<unknown>(`/api/v1/climate-uploads/${uploadId}/confirm`, null));
    return climateSiteSchema.parse(body);
  }

  /** How many of the organisation's files are being read, and how many wait their turn. */
  async uploadQueue(): Promise<UploadQueue> {
    return uploadQueueSchema.parse(await firstValueFrom(this.http.get<unknown>('/api/v1/climate-upload-queue')));
  }

  async discardUpload(uploadId: string): Promise<void> {
    await firstValueFrom(this.http.delete(`/api/v1/climate-uploads/${uploadId}`));
  }
}
