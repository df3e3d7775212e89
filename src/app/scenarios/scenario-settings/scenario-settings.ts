import type { EquipmentFamily, HeatPumpSizing } from '@shared/sweep/sweep';
import {
  ChangeDetectionStrategy,
  ChangeDetectorRef,
  Component,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import {
  MAT_FORM_FIELD_DEFAULT_OPTIONS,
  MatFormFieldModule,
  type MatFormFieldDefaultOptions,
} from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { EnergyPrices, GasPriceUnit } from '@shared/money/energy-prices';
import {
  EXTRA_DESIGN_TEMPERATURES_MAX,
  type Scenario,
  type ScenarioSettings,
} from '@shared/scenarios/scenario-schemas';
import { MAX_DRAWS } from '@shared/sweep/tolerances';
import { fromSi, toSi, unitLabel, type UnitSystem } from '@shared/units/units';
import { applyApiErrors, fieldError } from '../../core/api-errors';
import { VersionedEdit } from '../../core/versioned-edit';
import { EquipmentApi } from '../../equipment/equipment-api';
import { ProjectsApi } from '../../projects/projects-api';
import { ScenariosApi } from '../scenarios-api';

const PRICE_PATTERN = /^\d{1,9}(\.\d{1,6})?$/;

/** Parses "−15, -22.5" typed in the user's temperature unit into °C; null when a part is not a number. */
export function parseTemperatures(text: string, system: UnitSystem): number[] | null {
  const parts = text
    .replaceAll('−', '-')
    .split(/[,;\s]+/)
    .map((p) => p.trim())
    .filter((p) => p.length > 0);
  const values = parts.map(Number);
  if (values.some((v) => !Number.isFinite(v))) return null;
  return values.map((v) => Math.round(toSi('temperature', v, system) * 100) / 100);
}

export function formatTemperatures(valuesC: readonly number[], system: UnitSystem): string {
  return valuesC.map((c) => String(Math.round(fromSi('temperature', c, system) * 10) / 10)).join(', ');
}

/** A scenario's inputs: climate site, equipment list (or some of its options), sizing margin, economics and prices. */
@Component({
  selector: 'app-scenario-settings',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './scenario-settings.html',
  styleUrl: './scenario-settings.scss',
  // Several hints here run to two lines: let the space under a field grow rather than overlap the next row.
  providers: [
    {
      provide: MAT_FORM_FIELD_DEFAULT_OPTIONS,
      useValue: { appearance: 'outline', subscriptSizing: 'dynamic' } satisfies MatFormFieldDefaultOptions,
    },
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScenarioSettingsPanel {
  readonly scenario = input.required<Scenario>();
  readonly canEdit = input.required<boolean>();
  readonly unitSystem = input.required<UnitSystem>();
  /** The saved scenario, after a successful save. */
  readonly saved = output<Scenario>();

  private readonly api = inject(ScenariosApi);
  private readonly equipment = inject(EquipmentApi);
  private readonly cdr = inject(ChangeDetectorRef);
  private readonly fb = inject(NonNullableFormBuilder);
  /** A ± tolerance of the uncertainty band, in percent. */
  private readonly tolerance = (pct: number) =>
    this.fb.control(pct, [Validators.required, Validators.min(0), Validators.max(90)]);
  protected readonly sites = inject(ProjectsApi).climateSiteChoicesResource();
  protected readonly lists = this.equipment.listsResource();

  protected readonly form = this.fb.group({
    climateSiteId: this.fb.control<string | null>(null, Validators.required),
    equipmentListId: this.fb.control<string | null>(null, Validators.required),
    wholeList: this.fb.control(true),
    safetyFactorPct: this.fb.control('', [Validators.pattern(/^\d{0,3}(\.\d+)?$/), Validators.max(100)]),
    discountRatePct: this.fb.control('3', [Validators.required, Validators.min(0), Validators.max(30)]),
    studyPeriodYears: this.fb.control('20', [
      Validators.required,
      Validators.min(1),
      Validators.max(100),
      Validators.pattern(/^\d+$/),
    ]),
    energyEscalationPctPerYear: this.fb.control('0', [Validators.required, Validators.min(-10), Validators.max(20)]),
    heatPumpSizing: this.fb.control<HeatPumpSizing>('compressor'),
    equipmentFamily: this.fb.control<EquipmentFamily | 'all'>('all'),
    extraDesign: this.fb.control(''),
    /** Climate basis: empty for the whole record, or the number of recent years (8 or more). */
    climateBasisYears: this.fb.control('', [Validators.pattern(/^\d{0,3}$/), Validators.min(8), Validators.max(200)]),
    ownPrices: this.fb.control(false),
    currency: this.fb.control('USD'),
    electricityPerKwh: this.fb.control('', Validators.pattern(PRICE_PATTERN)),
    gasUnit: this.fb.control<GasPriceUnit>('m3'),
    gasPrice: this.fb.control('', Validators.pattern(PRICE_PATTERN)),
    oilPerLitre: this.fb.control('', Validators.pattern(PRICE_PATTERN)),
    propanePerLitre: this.fb.control('', Validators.pattern(PRICE_PATTERN)),
    uaPct: this.tolerance(10),
    airLeakagePct: this.tolerance(25),
    pricesPct: this.tolerance(15),
    draws: this.fb.control(300, [
      Validators.required,
      Validators.min(0),
      Validators.max(MAX_DRAWS),
      Validators.pattern(/^\d+$/),
    ]),
    seed: this.fb.control(1, [
      Validators.required,
      Validators.min(0),
      Validators.max(4_294_967_295),
      Validators.pattern(/^\d+$/),
    ]),
    ruleMaxWorstHours: this.fb.control<number | null>(null, [Validators.min(0), Validators.max(8784)]),
    ruleMaxOddsPct: this.fb.control<number | null>(null, [Validators.min(0), Validators.max(100)]),
  });
  protected readonly chosenLabels = signal<ReadonlySet<string>>(new Set());
  protected readonly listOptions = signal<string[]>([]);
  /** The scenario as last shown or saved (saves are made from its version); Reload loads the latest over the form. */
  protected readonly edit = new VersionedEdit<Scenario>({
    load: (s) => this.api.get(s.projectId, s.id),
    placeErrors: (e) => applyApiErrors(this.form, e),
  });
  protected readonly temperatureUnit = computed(() => unitLabel('temperature', this.unitSystem()));
  protected readonly extraMax = EXTRA_DESIGN_TEMPERATURES_MAX;
  protected readonly maxDraws = MAX_DRAWS;
  protected readonly fieldError = fieldError;
  /** The tolerances of the uncertainty band, drawn alike. */
  protected readonly tolerances = [
    { control: 'uaPct', label: 'UA tolerance' },
    { control: 'airLeakagePct', label: 'Air leakage tolerance' },
    { control: 'pricesPct', label: 'Energy price tolerance' },
  ] as const;

  constructor() {
    effect(() => {
      const s = this.scenario();
      untracked(() => this.show(s));
    });
    effect(() => {
      if (this.canEdit()) this.form.enable({ emitEvent: false });
      else this.form.disable({ emitEvent: false });
    });
    this.form.controls.equipmentListId.valueChanges.subscribe((id) => void this.loadOptions(id, null));
  }

  private show(s: Scenario): void {
    const previous = this.edit.record();
    this.edit.record.set(s);
    this.fillUnlessSame(previous, s);
  }

  private fillUnlessSame(previous: Scenario | null, s: Scenario): void {
    // Choosing a design point saves it with the scenario (a new version, same settings): keep what
    // the user is typing here and only take the new version.
    if (previous?.id === s.id && sameSettings(previous, s)) return;
    const st = s.settings;
    this.form.reset(
      {
        climateSiteId: s.climateSiteId,
        equipmentListId: s.equipmentListId,
        wholeList: st.optionLabels === null,
        safetyFactorPct: st.safetyFactorPct === null ? '' : String(st.safetyFactorPct),
        discountRatePct: String(st.discountRatePct),
        studyPeriodYears: String(st.studyPeriodYears),
        energyEscalationPctPerYear: String(st.energyEscalationPctPerYear),
        heatPumpSizing: st.heatPumpSizing,
        equipmentFamily: st.equipmentFamily ?? 'all',
        extraDesign: formatTemperatures(st.extraDesignC, this.unitSystem()),
        climateBasisYears: st.climateBasisYears === null ? '' : String(st.climateBasisYears),
        ownPrices: st.prices !== null,
        currency: st.prices?.currency ?? 'USD',
        electricityPerKwh: st.prices?.electricityPerKwh ?? '',
        gasUnit: st.prices?.gas?.unit ?? 'm3',
        gasPrice: st.prices?.gas?.price ?? '',
        oilPerLitre: st.prices?.oilPerLitre ?? '',
        propanePerLitre: st.prices?.propanePerLitre ?? '',
        uaPct: st.tolerances.uaPct,
        airLeakagePct: st.tolerances.airLeakagePct,
        pricesPct: st.tolerances.pricesPct,
        draws: st.uncertainty.draws,
        seed: st.uncertainty.seed,
        ruleMaxWorstHours: st.rule?.maxUnmetHoursWorstYear ?? null,
        ruleMaxOddsPct: st.rule?.maxLifetimeOddsPct ?? null,
      },
      { emitEvent: false },
    );
    void this.loadOptions(s.equipmentListId, st.optionLabels);
  }

  private async loadOptions(listId: string | null, chosen: readonly string[] | null): Promise<void> {
    if (!listId) {
      this.listOptions.set([]);
      return;
    }
    try {
      const list = await this.equipment.get(listId);
      const labels = [...new Set(list.options.map((o) => o.label))];
      this.listOptions.set(labels);
      this.chosenLabels.set(new Set(chosen ?? labels));
    } catch {
      this.listOptions.set([]);
    }
  }

  protected toggleOption(label: string, on: boolean): void {
    const next = new Set(this.chosenLabels());
    if (on) next.add(label);
    else next.delete(label);
    this.chosenLabels.set(next);
    this.form.markAsDirty();
  }

  /** Fills the scenario's own prices from the organisation's when they are switched on empty. */
  protected async ownPricesChanged(on: boolean): Promise<void> {
    if (!on || this.form.controls.electricityPerKwh.value) return;
    try {
      const p = (await this.equipment.getEnergyPrices()).prices;
      if (p) {
        this.form.patchValue({
          currency: p.currency,
          electricityPerKwh: p.electricityPerKwh,
          gasUnit: p.gas?.unit ?? 'm3',
          gasPrice: p.gas?.price ?? '',
          oilPerLitre: p.oilPerLitre ?? '',
          propanePerLitre: p.propanePerLitre ?? '',
        });
      }
    } finally {
      this.cdr.markForCheck();
    }
  }

  private settingsValue(): ScenarioSettings | string {
    const v = this.form.getRawValue();
    const extra = parseTemperatures(v.extraDesign, this.unitSystem());
    if (extra === null)
      return `Enter the extra design temperatures as numbers in ${this.temperatureUnit()}, separated by commas`;
    if (extra.length > EXTRA_DESIGN_TEMPERATURES_MAX)
      return `Add at most ${EXTRA_DESIGN_TEMPERATURES_MAX} design temperatures`;
    let prices: EnergyPrices | null = null;
    if (v.ownPrices) {
      if (!PRICE_PATTERN.test(v.electricityPerKwh))
        return 'Enter this scenario’s electricity price per kWh, or use the organisation’s prices';
      prices = {
        currency: v.currency,
        electricityPerKwh: v.electricityPerKwh,
        ...(v.gasPrice ? { gas: { unit: v.gasUnit, price: v.gasPrice } } : {}),
        ...(v.oilPerLitre ? { oilPerLitre: v.oilPerLitre } : {}),
        ...(v.propanePerLitre ? { propanePerLitre: v.propanePerLitre } : {}),
      };
    }
    const labels = this.listOptions().filter((l) => this.chosenLabels().has(l));
    if (!v.wholeList && labels.length === 0) return 'Choose at least one option, or consider the whole list';
    return {
      extraDesignC: extra,
      discountRatePct: Number(v.discountRatePct),
      studyPeriodYears: Number(v.studyPeriodYears),
      energyEscalationPctPerYear: Number(v.energyEscalationPctPerYear),
      heatPumpSizing: v.heatPumpSizing,
      equipmentFamily: v.equipmentFamily === 'all' ? null : v.equipmentFamily,
      safetyFactorPct: v.safetyFactorPct.trim() === '' ? null : Number(v.safetyFactorPct),
      prices,
      optionLabels: v.wholeList ? null : labels,
      climateBasisYears: v.climateBasisYears.trim() === '' ? null : Number(v.climateBasisYears),
      tolerances: { uaPct: v.uaPct, airLeakagePct: v.airLeakagePct, pricesPct: v.pricesPct },
      uncertainty: { draws: v.draws, seed: v.seed },
      rule:
        v.ruleMaxWorstHours === null && v.ruleMaxOddsPct === null
          ? null
          : { maxUnmetHoursWorstYear: v.ruleMaxWorstHours, maxLifetimeOddsPct: v.ruleMaxOddsPct },
    };
  }

  protected async save(): Promise<void> {
    if (!this.edit.record() || this.edit.isPending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const settings = this.settingsValue();
    if (typeof settings === 'string') {
      this.edit.refuse(settings);
      return;
    }
    const v = this.form.getRawValue();
    const saved = await this.edit.save((base) =>
      this.api.update(base.projectId, base.id, {
        version: base.version,
        climateSiteId: v.climateSiteId,
        equipmentListId: v.equipmentListId,
        settings,
      }),
    );
    if (!saved) return;
    this.form.markAsPristine();
    this.saved.emit(saved);
  }

  /** Loads the latest saved scenario over the form (after someone else saved). */
  protected async reload(): Promise<void> {
    const previous = this.edit.record();
    const latest = await this.edit.reload();
    if (!latest) return;
    this.fillUnlessSame(previous, latest);
    this.saved.emit(latest);
  }
}

/** Same site, list and settings: only the version or the chosen design point differ. */
function sameSettings(a: Scenario, b: Scenario): boolean {
  return (
    a.climateSiteId === b.climateSiteId &&
    a.equipmentListId === b.equipmentListId &&
    JSON.stringify(a.settings) === JSON.stringify(b.settings)
  );
}
