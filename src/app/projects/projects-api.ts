import { HttpClient, httpResource } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import {
  projectListSchema,
  projectSchema,
  type Project,
  type ProjectInput,
} from '@shared/projects/project-schemas';
import { AuthStore } from '../auth/auth-store';

@Injectable({ providedIn: 'root' })
export class ProjectsApi {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);
  private readonly url = '/api/v1/projects';

  /** The current organisation's projects; loads again when the organisation changes. */
  listResource() {
    return httpResource(
      () => (this.auth.currentOrganizationId() ? this.url : undefined),
      { parse: projectListSchema.parse },
    );
  }

  async create(input: ProjectInput): Promise<Project> {
    return projectSchema.parse(await firstValueFrom(this.http.post<unknown>(this.url, input)));
  }
}
