import { HttpClient, httpResource } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import { z } from 'zod';
import { climateSiteSummarySchema } from '@shared/climate/climate-schemas';
import { equipmentListSummarySchema } from '@shared/equipment/equipment-schemas';
import {
  projectListSchema,
  projectSchema,
  type Project,
  type ProjectInput,
  type ProjectPatch,
} from '@shared/projects/project-schemas';
import { AuthStore } from '../auth/auth-store';

/** What the climate-site select of a project needs to know about a site. */
export const climateSiteChoiceSchema = climateSiteSummarySchema.pick({
  id: true,
  name: true,
  isDemo: true,
  heatingDb99_6: true,
});
export type ClimateSiteChoice = z.infer<typeof climateSiteChoiceSchema>;
const climateSiteChoiceListSchema = z.array(climateSiteChoiceSchema);

/** What the equipment-list select of a project needs to know about a list. */
export const equipmentListChoiceSchema = equipmentListSummarySchema.pick({ id: true, name: true, optionCount: true });
export type EquipmentListChoice = z.infer<typeof equipmentListChoiceSchema>;
const equipmentListChoiceListSchema = z.array(equipmentListChoiceSchema);

/** Projects of the current organisation. */
@Injectable({ providedIn: 'root' })
export class ProjectsApi {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);
  private readonly url = '/api/v1/projects';

  /** Active projects, or archived ones when `archived()` is true; loads again when either changes. */
  listResource(archived: () => boolean = () => false) {
    return httpResource(
      () => {
        if (!this.auth.currentOrganizationId()) return undefined;
        return archived() ? `${this.url}?archived=true` : this.url;
      },
      { parse: projectListSchema.parse },
    );
  }

  /** One project; `id` returns undefined while there is nothing to load. */
  projectResource(id: () => string | undefined) {
    return httpResource(
      () => {
        const projectId = id();
        return projectId && this.auth.currentOrganizationId() ? `${this.url}/${projectId}` : undefined;
      },
      { parse: projectSchema.parse },
    );
  }

  /** The organisation's climate sites, to choose a project's site from. */
  climateSiteChoicesResource() {
    return httpResource(() => (this.auth.currentOrganizationId() ? '/api/v1/climate-sites' : undefined), {
      parse: climateSiteChoiceListSchema.parse,
    });
  }

  /** The organisation's equipment lists, to choose a project's list from. */
  equipmentListChoicesResource() {
    return httpResource(() => (this.auth.currentOrganizationId() ? '/api/v1/equipment-lists' : undefined), {
      parse: equipmentListChoiceListSchema.parse,
    });
  }

  async get(id: string): Promise<Project> {
    return projectSchema.parse(await firstValueFrom(this.http.get<unknown>(`${this.url}/${id}`)));
  }

  async create(input: ProjectInput): Promise<Project> {
    return projectSchema.parse(await firstValueFrom(this.http.post<unknown>(this.url, input)));
  }

  /** Answers 409 `stale_update` when someone saved since `patch.version`. */
  async update(id: string, patch: ProjectPatch): Promise<Project> {
    return projectSchema.parse(await firstValueFrom(this.http.patch<unknown>(`${this.url}/${id}`, patch)));
  }

  /** Copies a project as "<name> (copy)". */
  async duplicate(id: string): Promise<Project> {
    return projectSchema.parse(await firstValueFrom(this.http.post<unknown>(`${this.url}/${id}/duplicate`, null)));
  }

  async remove(id: string): Promise<void> {
    await firstValueFrom(this.http.delete(`${this.url}/${id}`));
  }
}
