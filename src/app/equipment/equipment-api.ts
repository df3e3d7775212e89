import { HttpClient, httpResource } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import { z } from 'zod';
import {
  energyPricesAnswerSchema,
  equipmentCsvPreviewResultSchema,
  equipmentListSchema,
  equipmentListSummarySchema,
  type EnergyPricesAnswer,
  type EquipmentList,
  type EquipmentOption,
  type EquipmentOptionInput,
} from '@shared/equipment/equipment-schemas';
import type { EnergyPrices } from '@shared/money/energy-prices';
import { AuthStore } from '../auth/auth-store';

const summaryListSchema = z.array(equipmentListSummarySchema);

/** The currency prices are shown in when the organisation has saved no energy prices yet. */
export const DEFAULT_CURRENCY = 'USD';

/** Equipment lists and energy prices of the current organisation. */
@Injectable({ providedIn: 'root' })
export class EquipmentApi {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);
  private readonly url = '/api/v1/equipment-lists';
  private readonly pricesUrl = '/api/v1/energy-prices';

  /** The lists, with their option counts. */
  listsResource() {
    return httpResource(() => (this.auth.currentOrganizationId() ? this.url : undefined), {
      parse: summaryListSchema.parse,
    });
  }

  /** One list with its options; `id` returns undefined while there is nothing to load. */
  listResource(id: () => string | undefined) {
    return httpResource(
      () => {
        const listId = id();
        return listId && this.auth.currentOrganizationId() ? `${this.url}/${listId}` : undefined;
      },
      { parse: equipmentListSchema.parse },
    );
  }

  /** The organisation's energy prices (`prices` null when none were saved). */
  energyPricesResource() {
    return httpResource(() => (this.auth.currentOrganizationId() ? this.pricesUrl : undefined), {
      parse: energyPricesAnswerSchema.parse,
    });
  }

  /** Where the browser downloads a list as CSV. */
  csvUrl(id: string): string {
    return `${this.url}/${id}/csv`;
  }

  async get(id: string): Promise<EquipmentList> {
    return equipmentListSchema.parse(await firstValueFrom(this.http.get<unknown>(`${this.url}/${id}`)));
  }

  async create(name: string): Promise<EquipmentList> {
    return equipmentListSchema.parse(await firstValueFrom(this.http.post<unknown>(this.url, { name })));
  }

  /** Answers 409 `stale_update` when someone saved the list since `version`. */
  async rename(id: string, version: number, name: string): Promise<EquipmentList> {
    return equipmentListSchema.parse(
      await firstValueFrom(this.http.patch<unknown>(`${this.url}/${id}`, { version, name })),
    );
  }

  async remove(id: string): Promise<void> {
    await firstValueFrom(this.http.delete(`${this.url}/${id}`));
  }

  /** Replaces all the options of a list; 409 `stale_update` when it changed since `version`. */
  async saveOptions(id: string, version: number, options: readonly EquipmentOptionInput[]): Promise<EquipmentList> {
    return equipmentListSchema.parse(
      await firstValueFrom(this.http.put<unknown>(`${this.url}/${id}/options`, { version, options })),
    );
  }

  /** Parses a CSV on the server without storing anything; a bad file answers 400 `invalid_file`. */
  async previewCsv(id: string, csv: string): Promise<EquipmentOption[]> {
    const body = await firstValueFrom(this.http.post<unknown>(`${this.url}/${id}/csv-preview`, { csv }));
    return equipmentCsvPreviewResultSchema.parse(body).options;
  }

  async getEnergyPrices(): Promise<EnergyPricesAnswer> {
    return energyPricesAnswerSchema.parse(await firstValueFrom(this.http.get<unknown>(this.pricesUrl)));
  }

  /** Saves the prices over `version` (0 when none were saved yet); 409 `stale_update` otherwise. */
  async saveEnergyPrices(version: number, prices: EnergyPrices): Promise<EnergyPricesAnswer> {
    return energyPricesAnswerSchema.parse(
      await firstValueFrom(this.http.put<unknown>(this.pricesUrl, { version, prices })),
    );
  }
}
