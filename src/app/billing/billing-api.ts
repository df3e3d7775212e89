import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import {
  billingSchema,
  providerPageSchema,
  usageSchema,
  type Billing,
  type BillingInterval,
  type Usage,
} from '@shared/billing/billing-schemas';

/** The organisation's plan, usage and billing through the payment provider. */
@Injectable({ providedIn: 'root' })
export class BillingApi {
  private readonly http = inject(HttpClient);

  async billing(): Promise<Billing> {
    return billingSchema.parse(await firstValueFrom(this.http.get<unknown>('/api/v1/billing')));
  }

  async usage(): Promise<Usage> {
    return usageSchema.parse(await firstValueFrom(this.http.get<unknown>('/api/v1/billing/usage')));
  }

  /** The provider's checkout page for a paid plan. */
  async checkout(plan: 'crew' | 'firm', interval: BillingInterval): Promise<string> {
    return providerPageSchema.parse(
      await firstValueFrom(this.http.post<unknown>('/api/v1/billing/checkout', { plan, interval })),
    ).url;
  }

  async portal(): Promise<string> {
    return providerPageSchema.parse(await firstValueFrom(this.http.post<unknown>('/api/v1/billing/portal', {}))).url;
  }

  async cancel(): Promise<void> {
    await firstValueFrom(this.http.post('/api/v1/billing/cancel', {}));
  }
}
