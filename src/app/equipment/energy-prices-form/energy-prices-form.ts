import { ChangeDetectionStrategy, Component, computed, effect, inject, signal, untracked } from '@angular/core';
import {
  type AbstractControl,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  type ValidationErrors,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { EnergyPricesAnswer } from '@shared/equipment/equipment-schemas';
import type { EnergyPrices, GasPriceUnit } from '@shared/money/energy-prices';
import { UNIT_PRICE_PATTERN } from '@shared/money/money';
import { AuthStore } from '../../auth/auth-store';
import { applyApiErrors, fieldError } from '../../core/api-errors';
import { VersionedEdit } from '../../core/versioned-edit';
import { DEFAULT_CURRENCY, EquipmentApi } from '../equipment-api';

const CURRENCIES = ['USD', 'CAD', 'EUR', 'GBP', 'AUD', 'NZD', 'CHF', 'SEK', 'NOK', 'DKK'] as const;

const GAS_UNITS: readonly { value: GasPriceUnit; label: string }[] = [
  { value: 'm3', label: 'per m³' },
  { value: 'kWh', label: 'per kWh' },
  { value: 'therm', label: 'per therm' },
];

/** A unit price as decimal text, spaces around it aside (they are trimmed before saving). */
function unitPrice(control: AbstractControl<string>): ValidationErrors | null {
  const value = control.value.trim();
  return value === '' || UNIT_PRICE_PATTERN.test(value) ? null : { pattern: true };
}

const PRICE_TEXTS = { required: 'Enter the electricity price' };

/** One line naming saved prices, e.g. "CAD · electricity 0.142 per kWh · gas 0.45 per m³". */
function describePrices(p: EnergyPrices): string {
  const parts = [p.currency, `electricity ${p.electricityPerKwh} per kWh`];
  if (p.gas) parts.push(`gas ${p.gas.price} ${GAS_UNITS.find((u) => u.value === p.gas?.unit)?.label ?? ''}`.trim());
  if (p.oilPerLitre) parts.push(`oil ${p.oilPerLitre} per litre`);
  if (p.propanePerLitre) parts.push(`propane ${p.propanePerLitre} per litre`);
  return parts.join(' · ');
}

/** The organisation's energy prices: currency, electricity, gas, oil and propane, as decimal text. */
@Component({
  selector: 'app-energy-prices-form',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
  ],
  templateUrl: './energy-prices-form.html',
  styleUrl: './energy-prices-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EnergyPricesForm {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly api = inject(EquipmentApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly loaded = this.api.energyPricesResource();
  /** Saves over the prices' version; after someone else saved, Reload takes theirs and keeps the typed values. */
  protected readonly edit = new VersionedEdit<EnergyPricesAnswer>({
    load: () => this.api.getEnergyPrices(),
    placeErrors: (e) => applyApiErrors(this.form, e),
  });
  /** The prices as last loaded or saved; a save is made from its version. */
  protected readonly answer = this.edit.record;
  protected readonly canWrite = computed(() => this.auth.can('project:write'));
  protected readonly gasUnits = GAS_UNITS;
  protected readonly currencies = computed(() => {
    const saved = this.answer()?.prices?.currency;
    return saved && !(CURRENCIES as readonly string[]).includes(saved) ? [...CURRENCIES, saved] : [...CURRENCIES];
  });

  private readonly price = (required = false) =>
    this.fb.control('', required ? [Validators.required, unitPrice] : [unitPrice]);

  protected readonly form = this.fb.group({
    prices: this.fb.group({
      currency: this.fb.control<string>(DEFAULT_CURRENCY, Validators.required),
      electricityPerKwh: this.price(true),
      gas: this.fb.group({ unit: this.fb.control<GasPriceUnit>('m3'), price: this.price() }),
      oilPerLitre: this.price(),
      propanePerLitre: this.price(),
    }),
  });
  protected readonly controls = this.form.controls.prices.controls;

  /** After a reload: the prices someone else saved, while the form keeps the user's values. */
  protected readonly latestSaved = signal('');

  constructor() {
    effect(() => {
      if (!this.loaded.hasValue()) return;
      const answer = this.loaded.value();
      untracked(() => this.show(answer));
    });
    effect(() => {
      if (this.canWrite()) this.form.enable();
      else this.form.disable();
    });
  }

  protected fieldError(control: Parameters<typeof fieldError>[0], required = false): string {
    if (control.errors?.['pattern']) return 'Enter a price such as 0.1523 (digits, a point and at most 6 decimals)';
    return fieldError(control, required ? PRICE_TEXTS : {});
  }

  protected async save(): Promise<void> {
    if (!this.answer() || this.edit.isPending() || !this.canWrite()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const saved = await this.edit.save((base) => this.api.saveEnergyPrices(base.version, this.value()));
    if (!saved) return;
    this.show(saved);
    this.latestSaved.set('');
    this.snackBar.open('Energy prices saved', 'Close', { duration: 4000 });
  }

  /** Takes the latest saved version, keeping the typed values so that Save puts them over it. */
  protected async reload(): Promise<void> {
    const latest = await this.edit.reload();
    if (latest) this.latestSaved.set(latest.prices ? describePrices(latest.prices) : 'no prices');
  }

  /** The typed prices, trimmed; fuels left empty are left out. */
  private value(): EnergyPrices {
    const v = this.form.controls.prices.getRawValue();
    const gas = v.gas.price.trim();
    const oil = v.oilPerLitre.trim();
    const propane = v.propanePerLitre.trim();
    const heatingValues = this.answer()?.prices?.heatingValues;
    return {
      currency: v.currency,
      electricityPerKwh: v.electricityPerKwh.trim(),
      ...(gas ? { gas: { unit: v.gas.unit, price: gas } } : {}),
      ...(oil ? { oilPerLitre: oil } : {}),
      ...(propane ? { propanePerLitre: propane } : {}),
      ...(heatingValues ? { heatingValues } : {}),
    };
  }

  private show(answer: EnergyPricesAnswer): void {
    this.answer.set(answer);
    const p = answer.prices;
    this.form.reset({
      prices: {
        currency: p?.currency ?? DEFAULT_CURRENCY,
        electricityPerKwh: p?.electricityPerKwh ?? '',
        gas: { unit: p?.gas?.unit ?? 'm3', price: p?.gas?.price ?? '' },
        oilPerLitre: p?.oilPerLitre ?? '',
        propanePerLitre: p?.propanePerLitre ?? '',
      },
    });
    if (!this.canWrite()) this.form.disable();
  }
}
