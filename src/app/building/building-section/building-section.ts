import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatRadioModule } from '@angular/material/radio';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import {
  type ProjectBuildingAnswer,
  DEFAULT_DESIGN_WIND_MS,
  buildingSchema,
  lblStoreys,
  shieldingClasses,
  thermalMassClasses,
  type Building,
  type ShieldingClass,
  type ThermalMassClass,
} from '@shared/building/building-schemas';
import { envelopeUa, resolveDesignWind, timeConstantHours } from '@shared/building/heat-loss';
import type { DesignConditions, PublishedDesignValues } from '@shared/climate/design-conditions-schema';
import { formatQuantity } from '@shared/units/units';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage, readApiError } from '../../core/api-errors';
import { VersionedEdit } from '../../core/versioned-edit';
import { ClimateSitesApi } from '../../climate/climate-sites-api';
import { BuildingApi } from '../building-api';
import {
  FIELD_UNITS,
  buildingFieldError,
  buildingForm,
  buildingInputOf,
  checkBuilding,
  envelopeRow,
  fillBuildingForm,
  formPathOf,
  resetBuildingForm,
  restoreBuildingForm,
  showIssues,
  type BuildingFormValue,
  type ServerIssue,
} from '../building-form';
import { HeatLossPanel } from '../heat-loss-panel/heat-loss-panel';
import { heatLossModel } from '../heat-loss-panel/heat-loss-model';
import { NFactorPicker } from '../n-factor-picker/n-factor-picker';
import { UnitField } from '../unit-field';

/** Which heating design dry-bulb of the site the live heat loss uses. */
export type DesignPercentile = '99' | '99.6';

/** Outdoor temperature typed when the project has no climate site with design values, °C. */
const DEFAULT_TYPED_OUTDOOR_C = -20;

const SHIELDING_LABELS: Record<ShieldingClass, string> = {
  1: '1 – no obstructions',
  2: '2 – light (scattered trees or buildings)',
  3: '3 – moderate (typical suburb)',
  4: '4 – heavy (close neighbours, dense trees)',
  5: '5 – very heavy (city centre)',
};

const MASS_LABELS: Record<ThermalMassClass, string> = {
  light: 'Light (timber frame, little masonry)',
  medium: 'Medium',
  heavy: 'Heavy (masonry or concrete inside the insulation)',
};

/** The site's design values the heat loss needs, from computed conditions or published values alike. */
interface SiteValues {
  db99: number;
  db99_6: number;
  wind: { coincident99_6: number | null; coldestMonth1: number | null };
  coldestC: number;
}

function siteValues(values: DesignConditions | PublishedDesignValues | null | undefined): SiteValues | null {
  if (!values) return null;
  const ext = values.extremeMin;
  const cold = [
    values.heating.db99_6,
    ext?.mean,
    ext?.returnPeriod?.['5'],
    ext?.returnPeriod?.['10'],
    ext?.returnPeriod?.['20'],
    ext?.returnPeriod?.['50'],
  ].filter((v): v is number => typeof v === 'number');
  return {
    db99: values.heating.db99,
    db99_6: values.heating.db99_6,
    wind: { coincident99_6: values.wind?.coincident99_6 ?? null, coldestMonth1: values.wind?.coldestMonth1 ?? null },
    coldestC: Math.min(...cold),
  };
}

/**
 * A project's building: the inputs of the heat-loss estimate, grouped, typed in the user's units and
 * saved in SI; beside them the heat loss as it stands, recomputed on every change.
 */
@Component({
  selector: 'app-building-section',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatRadioModule,
    MatSelectModule,
    HeatLossPanel,
    NFactorPicker,
    UnitField,
  ],
  templateUrl: './building-section.html',
  styleUrl: './building-section.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BuildingSection {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly api = inject(BuildingApi);
  private readonly sitesApi = inject(ClimateSitesApi);
  private readonly fb = inject(NonNullableFormBuilder);
  private readonly snackBar = inject(MatSnackBar);

  readonly projectId = input.required<string>();
  readonly climateSiteId = input<string | null>(null);
  readonly climateSiteName = input<string | null>(null);
  readonly equipmentListId = input<string | null>(null);
  /** The project's version as the page knows it (after its own saves). */
  readonly projectVersion = input<number | null>(null);
  /** The project's new version after the building was saved. */
  readonly saved = output<number>();

  protected readonly units = FIELD_UNITS;
  protected readonly fieldError = buildingFieldError;
  protected readonly storeyChoices = lblStoreys;
  protected readonly shieldingChoices = shieldingClasses;
  protected readonly shieldingLabels = SHIELDING_LABELS;
  protected readonly massChoices = thermalMassClasses;
  protected readonly massLabels = MASS_LABELS;

  protected readonly system = computed(() => this.auth.unitSystem());
  protected readonly canWrite = computed(() => this.auth.can('project:write'));

  protected readonly loaded = this.api.buildingResource(() => this.projectId());
  private readonly site = this.sitesApi.siteResource(() => this.climateSiteId() ?? undefined);
  private readonly list = this.api.equipmentListResource(() => this.equipmentListId());

  protected readonly form = buildingForm(this.fb);
  private readonly fresh = buildingForm(this.fb);
  /** Outdoor temperature typed when there is no site value, °C. */
  protected readonly typedOutdoor = new FormControl<number | null>(DEFAULT_TYPED_OUTDOOR_C);
  protected readonly percentile = signal<DesignPercentile>('99');
  protected readonly showPicker = signal(false);

  /** The form's values (SI), updated on every change. */
  protected readonly value = signal<BuildingFormValue>(this.form.getRawValue());
  private readonly typedOutdoorC = signal<number | null>(DEFAULT_TYPED_OUTDOOR_C);
  protected readonly check = computed(() => checkBuilding(this.value()));
  private readonly serverIssues = new Map<string, ServerIssue>();

  /**
   * The building as last loaded or saved, with the project's version saves are made from; a stale
   * save keeps the typed values, and Reload shows the latest saved building and keeps them aside.
   */
  protected readonly edit = new VersionedEdit<ProjectBuildingAnswer>({
    load: () => this.api.get(this.projectId()),
    placeErrors: (e) => this.applyServerErrors(e),
  });
  /** The user's values, kept aside when the latest saved building was loaded over them. */
  protected readonly kept = signal<BuildingFormValue | null>(null);

  // --- climate site and equipment

  protected readonly siteValues = computed<SiteValues | null>(() => {
    if (!this.climateSiteId() || !this.site.hasValue()) return null;
    const s = this.site.value();
    return siteValues(s.computed?.conditions ?? s.publishedValues);
  });
  protected readonly siteLoading = computed(() => !!this.climateSiteId() && this.site.isLoading());
  protected readonly siteName = computed(() =>
    this.site.hasValue() ? this.site.value().name : (this.climateSiteName() ?? 'the climate site'),
  );
  private readonly options = computed(() => (this.list.hasValue() ? this.list.value().options : []));

  protected readonly outdoorC = computed<number | null>(() => {
    const s = this.siteValues();
    if (s) return this.percentile() === '99' ? s.db99 : s.db99_6;
    return this.typedOutdoorC();
  });
  protected readonly outdoorLabel = computed(() => {
    const s = this.siteValues();
    if (!s) return 'typed in';
    return `${this.percentile()} % heating dry-bulb of ${this.siteName()}`;
  });

  protected readonly wind = computed(() => {
    const w = this.value().designWind;
    const choice = { source: w.source, ...(w.customMs === null ? {} : { customMs: w.customMs }) };
    return resolveDesignWind(choice, this.siteValues()?.wind);
  });

  // --- live heat loss

  /** The building for the heat loss: thermal mass does not enter it, so an incomplete one does not hide it. */
  private readonly heatLossBuilding = computed<Building | null>(() => {
    const c = this.check();
    if (c.ok) return c.building;
    if ([...c.issues.keys()].some((p) => !p.startsWith('thermalMass'))) return null;
    const input = buildingInputOf(this.value()) as Record<string, unknown>;
    const parsed = buildingSchema.safeParse({ ...input, thermalMass: { mode: 'hours', timeConstantH: 1 } });
    return parsed.success ? parsed.data : null;
  });

  protected readonly model = computed(() => {
    const building = this.heatLossBuilding();
    const outdoorC = this.outdoorC();
    if (!building || outdoorC === null) return null;
    return heatLossModel(
      building,
      outdoorC,
      this.wind().windMs,
      this.options(),
      this.siteValues()?.coldestC ?? null,
      this.system(),
    );
  });

  protected readonly timeConstantH = computed(() => {
    const c = this.check();
    const m = this.model();
    if (!c.ok || !m) return null;
    try {
      return timeConstantHours(c.building.thermalMass, m.result.conductanceWPerK.total);
    } catch {
      return null;
    }
  });

  /** Σ A·U of the envelope rows filled in so far. */
  protected readonly envelopeUaText = computed(() => {
    const rows = this.value()
      .conduction.components.filter((r) => (r.areaM2 ?? 0) > 0 && (r.value ?? 0) > 0)
      .map((r) => ({
        areaM2: r.areaM2 ?? 0,
        ...(r.kind === 'u' ? { uValue: r.value ?? 0 } : { rValue: r.value ?? 0 }),
      }));
    return formatQuantity('conductance', envelopeUa(rows), this.system());
  });
  protected readonly componentsError = computed(() => this.check().issues.get('conduction.components') ?? '');

  protected readonly windChoices = computed(() => {
    const site = this.siteValues();
    const system = this.system();
    const siteText = (v: number | null | undefined) => {
      if (!site) return `Needs a climate site; until then the ${this.defaultWindText()} default is used.`;
      return v === null || v === undefined
        ? `Not given for this site; the ${this.defaultWindText()} default is used.`
        : `This site: ${formatQuantity('speed', v, system)}.`;
    };
    const defaultText = this.defaultWindText();
    return [
      {
        value: 'coincident99_6',
        label: 'Coincident with the 99.6 % dry-bulb',
        text: `The mean wind during the site's coldest hours. Suits tight houses, where wind moves little air. ${siteText(site?.wind.coincident99_6)}`,
      },
      {
        value: 'coldestMonth1',
        label: 'Coldest-month 1 %',
        text: `Wind exceeded in 1 % of the coldest month's hours: a stiffer test for leaky houses. ${siteText(site?.wind.coldestMonth1)}`,
      },
      {
        value: 'default',
        label: `Trade default, ${defaultText}`,
        text: 'A common assumption when no site wind is at hand.',
      },
      { value: 'custom', label: 'Custom', text: 'A wind speed of your own.' },
    ];
  });

  protected readonly defaultWindText = computed(() => formatQuantity('speed', DEFAULT_DESIGN_WIND_MS, this.system()));

  protected readonly percentileText = computed(() => {
    const s = this.siteValues();
    const system = this.system();
    return {
      p99: s ? formatQuantity('temperature', s.db99, system) : '',
      p99_6: s ? formatQuantity('temperature', s.db99_6, system) : '',
    };
  });

  constructor() {
    this.form.valueChanges.pipe(takeUntilDestroyed(inject(DestroyRef))).subscribe(() => this.changed());
    this.typedOutdoor.valueChanges.pipe(takeUntilDestroyed(inject(DestroyRef))).subscribe((v) => {
      this.typedOutdoorC.set(v);
    });
    effect(() => {
      if (!this.loaded.hasValue()) return;
      const answer = this.loaded.value();
      untracked(() => this.show(answer));
    });
    effect(() => {
      if (this.canWrite()) this.form.enable();
      else this.form.disable();
    });
    effect(() => {
      const page = this.projectVersion();
      const own = untracked(() => this.edit.record());
      // The page saved the project's details from the same version: the building is unchanged.
      if (page !== null && own !== null && page > own.version) this.edit.record.set({ ...own, version: page });
    });
  }

  protected get rows() {
    return this.form.controls.conduction.controls.components.controls;
  }

  protected addRow(): void {
    this.form.controls.conduction.controls.components.push(envelopeRow(this.fb));
    this.form.markAsDirty();
  }

  protected removeRow(index: number): void {
    this.form.controls.conduction.controls.components.removeAt(index);
    this.form.markAsDirty();
  }

  protected useNFactor(n: number): void {
    const control = this.form.controls.airLeakage.controls.nFactor;
    control.setValue(n);
    control.markAsDirty();
    this.showPicker.set(false);
  }

  protected async save(): Promise<void> {
    if (this.edit.isPending() || !this.canWrite() || this.edit.record() === null) return;
    this.form.markAllAsTouched();
    const check = this.check();
    if (!check.ok) {
      const unplaced = showIssues(this.form, check.issues, this.serverIssues);
      this.edit.refuse(['Some values need attention; see the marked fields.', ...unplaced].join(' '));
      return;
    }
    const answer = await this.edit.save((base) => this.api.put(this.projectId(), base.version, check.building));
    if (!answer) return;
    this.show(answer);
    this.kept.set(null);
    this.saved.emit(answer.version);
    this.snackBar.open('Building saved', 'Close', { duration: 4000 });
  }

  /** Loads the latest saved building and keeps the user's values aside, ready to put back. */
  protected async reload(): Promise<void> {
    const typed = this.form.getRawValue();
    const latest = await this.edit.reload();
    if (!latest) return;
    this.show(latest);
    this.kept.set(typed);
  }

  /** Puts the values kept aside back into the form, to be saved over the latest version. */
  protected putBack(): void {
    const typed = this.kept();
    if (!typed) return;
    restoreBuildingForm(this.form, this.fb, typed);
    this.kept.set(null);
  }

  protected leaveOut(): void {
    this.kept.set(null);
  }

  /** Puts the form back to the building as saved. */
  protected discard(): void {
    this.fill(this.edit.record()?.building ?? null);
    this.edit.clear();
    this.serverIssues.clear();
    this.changed();
  }

  private show(answer: ProjectBuildingAnswer): void {
    this.edit.record.set(answer);
    this.serverIssues.clear();
    this.fill(answer.building);
  }

  private fill(building: Building | null): void {
    if (building) fillBuildingForm(this.form, this.fb, building);
    else resetBuildingForm(this.form, this.fresh);
    if (!this.canWrite()) this.form.disable();
    this.form.markAsPristine();
    this.form.markAsUntouched();
  }

  /** Every change: the live values, and the messages on the fields. */
  private changed(): void {
    this.value.set(this.form.getRawValue());
    showIssues(this.form, this.check().issues, this.serverIssues);
  }

  /** The server's field messages (`building.airLeakage.ach50`…) on their fields; the rest as one message. */
  private applyServerErrors(err: unknown): string {
    const body = readApiError(err);
    if (!body) return apiErrorMessage(err);
    const unplaced: string[] = [];
    for (const detail of body.details ?? []) {
      const path = formPathOf(detail.path);
      const control = path ? this.form.get(path) : null;
      if (control && !(control.value !== null && typeof control.value === 'object')) {
        this.serverIssues.set(path, { message: detail.message, value: control.value });
        control.markAsTouched();
      } else if (detail.message !== body.message) {
        unplaced.push(detail.message);
      }
    }
    showIssues(this.form, this.check().issues, this.serverIssues);
    return [body.message, ...unplaced].join(' ');
  }
}
