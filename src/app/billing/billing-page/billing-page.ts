import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { firstValueFrom } from 'rxjs';
import { PLANS, planIds, type Billing, type BillingInterval, type PlanId } from '@shared/billing/billing-schemas';
import { formatMoney } from '@shared/money/money';
import { apiErrorMessage } from '../../core/api-errors';
import { ConfirmDialog, type ConfirmDialogData } from '../../ui/confirm-dialog/confirm-dialog';
import { BillingApi } from '../billing-api';

const STATUS_TEXT: Record<Billing['status'], string> = {
  none: 'Free plan',
  trialing: 'Trial',
  active: 'Active',
  past_due: 'Payment overdue: the provider is retrying the card',
  canceled: 'Cancelled',
};

/** `/billing` (owners): the plan, usage against its limits, upgrade through the provider's checkout, its portal, cancellation. */
@Component({
  selector: 'app-billing-page',
  imports: [DatePipe, MatButtonModule, MatButtonToggleModule, MatIconModule, MatProgressBarModule],
  templateUrl: './billing-page.html',
  styleUrl: './billing-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BillingPage {
  /** Query parameter set by the provider's redirect: `success` or `cancelled`. */
  readonly checkout = input<string | undefined>();

  private readonly api = inject(BillingApi);
  private readonly dialog = inject(MatDialog);
  private readonly destroyRef = inject(DestroyRef);

  protected readonly billing = signal<Billing | null>(null);
  protected readonly error = signal('');
  protected readonly pending = signal(false);
  /** After a checkout: waiting for the provider to confirm through its webhook. */
  protected readonly waiting = signal(false);
  /** The plan the provider confirmed after this checkout (shown once, as a success message). */
  protected readonly confirmed = signal('');
  protected readonly interval = signal<BillingInterval>('month');
  protected readonly statusText = STATUS_TEXT;
  protected readonly plans = planIds.map((id) => PLANS[id]);
  protected readonly subscribed = computed(() => {
    const b = this.billing();
    return b !== null && b.usage.plan !== 'starter';
  });
  private polling: ReturnType<typeof setTimeout> | null = null;

  constructor() {
    this.destroyRef.onDestroy(() => {
      if (this.polling) clearTimeout(this.polling);
    });
    effect(() => {
      const checkout = this.checkout();
      untracked(() => void this.load(checkout === 'success'));
    });
  }

  private async load(waitForConfirmation: boolean): Promise<void> {
    try {
      const b = await this.api.billing();
      this.billing.set(b);
      if (waitForConfirmation && b.usage.plan === 'starter') {
        this.waiting.set(true);
        this.poll(30);
      } else if (waitForConfirmation) {
        this.confirmed.set(b.usage.planName);
      }
    } catch (err) {
      this.error.set(apiErrorMessage(err, 'Billing could not be loaded.'));
    }
  }

  /** The plan changes only when the provider confirms; check again for a while. */
  private poll(left: number): void {
    this.polling = setTimeout(() => {
      void (async () => {
        try {
          const b = await this.api.billing();
          this.billing.set(b);
          if (b.usage.plan !== 'starter') {
            this.waiting.set(false);
            this.confirmed.set(b.usage.planName);
          } else if (left > 1) this.poll(left - 1);
          else this.waiting.set(false);
        } catch {
          if (left > 1) this.poll(left - 1);
        }
      })();
    }, 1000);
  }

  /** A provider event as an owner reads it: "Subscription updated" rather than `customer.subscription.updated`. */
  protected eventText(type: string): string {
    const known: Record<string, string> = {
      'checkout.session.completed': 'Checkout completed',
      'customer.subscription.created': 'Subscription started',
      'customer.subscription.updated': 'Subscription updated',
      'customer.subscription.deleted': 'Subscription ended',
      'invoice.paid': 'Invoice paid',
      'invoice.payment_failed': 'Payment failed',
    };
    const text = known[type] ?? type.replace(/^customer\./, '').replace(/[._]/g, ' ');
    return text.charAt(0).toUpperCase() + text.slice(1);
  }

  protected price(id: PlanId): string {
    const p = PLANS[id].prices;
    if (!p) return 'Free';
    const i = this.interval();
    return `${formatMoney(p[i], 'USD')} a ${i}`;
  }

  protected limitText(limit: number | null, noun: string): string {
    return limit === null ? `Unlimited ${noun}` : `${limit} ${noun}`;
  }

  protected percent(used: number, limit: number | null): number {
    return limit === null ? 0 : Math.min(100, Math.round((100 * used) / limit));
  }

  protected async choose(plan: PlanId): Promise<void> {
    if (plan === 'starter') return;
    await this.run(async () => {
      window.location.assign(await this.api.checkout(plan, this.interval()));
    });
  }

  protected async manage(): Promise<void> {
    await this.run(async () => {
      window.location.assign(await this.api.portal());
    });
  }

  protected async cancel(): Promise<void> {
    const data: ConfirmDialogData = {
      title: 'Cancel at the end of the period?',
      message:
        'The plan stays until the end of the paid period, then the organisation returns to the free Starter plan. Projects over its limit stay readable.',
      confirmLabel: 'Cancel the plan',
    };
    const ok = await firstValueFrom(
      this.dialog.open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data }).afterClosed(),
    );
    if (!ok) return;
    await this.run(async () => {
      await this.api.cancel();
      this.waiting.set(true);
      this.poll(10);
    });
  }

  private async run(action: () => Promise<void>): Promise<void> {
    this.pending.set(true);
    this.error.set('');
    try {
      await action();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.pending.set(false);
    }
  }
}
