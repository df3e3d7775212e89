import { HttpClient, httpResource } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import {
  projectBuildingAnswerSchema,
  type ProjectBuildingAnswer,
  type Building,
} from '@shared/building/building-schemas';
import { equipmentListSchema } from '@shared/equipment/equipment-schemas';
import { AuthStore } from '../auth/auth-store';

/** A project's building, and the equipment list its heat loss is compared with. */
@Injectable({ providedIn: 'root' })
export class BuildingApi {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);

  private url(projectId: string): string {
    return `/api/v1/projects/${projectId}/building`;
  }

  /** The saved building (null until saved) and the project's version. */
  buildingResource(projectId: () => string | undefined) {
    return httpResource(
      () => {
        const id = projectId();
        return id && this.auth.currentOrganizationId() ? this.url(id) : undefined;
      },
      { parse: projectBuildingAnswerSchema.parse },
    );
  }

  /** One equipment list with its options; `id` returns undefined when the project has none. */
  equipmentListResource(id: () => string | null | undefined) {
    return httpResource(
      () => {
        const listId = id();
        return listId && this.auth.currentOrganizationId() ? `/api/v1/equipment-lists/${listId}` : undefined;
      },
      { parse: equipmentListSchema.parse },
    );
  }

  async get(projectId: string): Promise<ProjectBuildingAnswer> {
    return projectBuildingAnswerSchema.parse(await firstValueFrom(this.http.get<unknown>(this.url(projectId))));
  }

  /** Saves the building over the project's `version`: 409 `stale_update` when someone saved since. */
  async put(projectId: string, version: number, building: Building): Promise<ProjectBuildingAnswer> {
    const body = await firstValueFrom(this.http.put<unknown>(this.url(projectId), { version, building }));
    return projectBuildingAnswerSchema.parse(body);
  }
}
