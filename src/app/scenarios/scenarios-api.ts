import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import {
  comparisonSchema,
  scenarioListSchema,
  scenarioSchema,
  sweepAnswerSchema,
  type Comparison,
  type Scenario,
  type ScenarioInput,
  type ScenarioPatch,
  type SweepAnswer,
} from '@shared/scenarios/scenario-schemas';

/** A project's scenarios, their sweeps and comparisons. */
@Injectable({ providedIn: 'root' })
export class ScenariosApi {
  private readonly http = inject(HttpClient);

  private base(projectId: string): string {
    return `/api/v1/projects/${projectId}/scenarios`;
  }

  async list(projectId: string): Promise<Scenario[]> {
    return scenarioListSchema.parse(await firstValueFrom(this.http.get<unknown>(this.base(projectId))));
  }

  async get(projectId: string, id: string): Promise<Scenario> {
    return scenarioSchema.parse(await firstValueFrom(this.http.get<unknown>(`${this.base(projectId)}/${id}`)));
  }

  async create(projectId: string, input: ScenarioInput): Promise<Scenario> {
    return scenarioSchema.parse(await firstValueFrom(this.http.post<unknown>(this.base(projectId), input)));
  }

  /** 409 `stale_update` when someone saved since `patch.version`; 409 `frozen` for the inputs of a frozen copy. */
  async update(projectId: string, id: string, patch: ScenarioPatch): Promise<Scenario> {
    return scenarioSchema.parse(await firstValueFrom(this.http.patch<unknown>(`${this.base(projectId)}/${id}`, patch)));
  }

  async duplicate(projectId: string, id: string, name?: string): Promise<Scenario> {
    return scenarioSchema.parse(
      await firstValueFrom(this.http.post<unknown>(`${this.base(projectId)}/${id}/duplicate`, name ? { name } : {})),
    );
  }

  /** An immutable dated copy for a bid; the scenario itself stays editable. */
  async freeze(projectId: string, id: string, name?: string): Promise<Scenario> {
    return scenarioSchema.parse(
      await firstValueFrom(this.http.post<unknown>(`${this.base(projectId)}/${id}/freeze`, name ? { name } : {})),
    );
  }

  async remove(projectId: string, id: string): Promise<void> {
    await firstValueFrom(this.http.delete(`${this.base(projectId)}/${id}`));
  }

  /** Runs the sweep (or reads it from the result cache). 422 `scenario_incomplete` lists what is missing. */
  async sweep(projectId: string, id: string): Promise<SweepAnswer> {
    return sweepAnswerSchema.parse(
      await firstValueFrom(this.http.post<unknown>(`${this.base(projectId)}/${id}/sweep`, null)),
    );
  }

  sweepCsvUrl(projectId: string, id: string): string {
    return `${this.base(projectId)}/${id}/sweep.csv`;
  }

  async compare(projectId: string, ids: readonly string[]): Promise<Comparison> {
    return comparisonSchema.parse(
      await firstValueFrom(
        this.http.get<unknown>(`/api/v1/projects/${projectId}/scenario-comparison`, { params: { ids: ids.join(',') } }),
      ),
    );
  }

  compareCsvUrl(projectId: string, ids: readonly string[]): string {
    return `/api/v1/projects/${projectId}/scenario-comparison.csv?ids=${ids.map(encodeURIComponent).join(',')}`;
  }
}
