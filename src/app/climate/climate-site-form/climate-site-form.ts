import {
  ChangeDetectionStrategy,
  Component,
  type OnInit,
  computed,
  effect,
  inject,
  input,
  output,
  signal,
  untracked,
} from '@angular/core';
import { FormControl, NonNullableFormBuilder, ReactiveFormsModule, type ValidatorFn, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { PublishedDesignValues } from '@shared/climate/design-conditions-schema';
import {
  CLIMATE_SITE_NAME_MAX,
  type ClimateSite,
  type ClimateSiteInput,
  type ClimateSitePatch,
  type SourceKind,
} from '@shared/climate/climate-schemas';
import { fromSi, toSi, type UnitSystem } from '@shared/units/units';
import { AuthStore } from '../../auth/auth-store';
import { applyApiErrors, fieldError } from '../../core/api-errors';
import { MONTH_NAMES } from '../climate-format';
import { ClimateSitesApi } from '../climate-sites-api';
import {
  ALL_NUMBER_FIELDS,
  LOCATION_FIELDS,
  PERIOD_FIELDS,
  PUBLISHED_SECTIONS,
  fieldLabel,
  roundConverted,
  type NumberField,
} from './climate-site-fields';

const PUBLISHED_PREFIX = 'publishedValues.';

function readPath(source: unknown, path: string): unknown {
  let value = source;
  for (const key of path.split('.')) {
    if (typeof value !== 'object' || value === null) return undefined;
    value = (value as Record<string, unknown>)[key];
  }
  return value;
}

function writePath(target: Record<string, unknown>, path: string, value: unknown): void {
  const keys = path.split('.');
  const last = keys.pop() ?? '';
  let node = target;
  for (const key of keys) {
    const next = node[key];
    if (typeof next === 'object' && next !== null) {
      node = next as Record<string, unknown>;
    } else {
      const created: Record<string, unknown> = {};
      node[key] = created;
      node = created;
    }
  }
  node[last] = value;
}

/**
 * A climate site's location and, for published sites, every design value of the published table.
 * Values are typed in the user's units and sent in SI. Creates the site, or saves changes to `site`.
 */
@Component({
  selector: 'app-climate-site-form',
  imports: [ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatSelectModule],
  templateUrl: './climate-site-form.html',
  styleUrl: './climate-site-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ClimateSiteForm implements OnInit {
  // services
  private readonly api = inject(ClimateSitesApi);
  private readonly auth = inject(AuthStore);
  private readonly fb = inject(NonNullableFormBuilder);

  /** Which kind of site to create (ignored when editing). */
  readonly sourceKind = input<SourceKind>('published');
  /** The site to edit; null to create a new one. */
  readonly site = input<ClimateSite | null>(null);
  readonly saved = output<ClimateSite>();
  readonly cancelled = output();

  protected readonly fieldError = fieldError;
  protected readonly locationFields = LOCATION_FIELDS;
  protected readonly periodFields = PERIOD_FIELDS;
  protected readonly sections = PUBLISHED_SECTIONS;
  protected readonly months = MONTH_NAMES.map((name, i) => ({ value: i + 1, name }));

  /** The unit system the numbers in the form are written in (follows the user's choice). */
  protected readonly formSystem = signal<UnitSystem>(untracked(() => this.auth.unitSystem()));
  protected readonly kind = computed<SourceKind>(() => this.site()?.sourceKind ?? this.sourceKind());
  protected readonly editing = computed(() => this.site() !== null);
  protected readonly pending = signal(false);
  protected readonly formError = signal('');

  private num(...validators: ValidatorFn[]) {
    return this.fb.control<number | null>(null, validators);
  }

  private humidification() {
    return this.fb.group({
      dewPoint: this.num(),
      humidityRatio: this.num(Validators.min(0)),
      meanCoincidentDryBulb: this.num(),
      relativeHumidity: this.num(Validators.min(0), Validators.max(100)),
    });
  }

  protected readonly form = this.fb.group({
    name: this.fb.control('', [Validators.required, Validators.maxLength(CLIMATE_SITE_NAME_MAX)]),
    latitude: this.num(Validators.min(-90), Validators.max(90)),
    longitude: this.num(Validators.min(-180), Validators.max(180)),
    elevationM: this.num(),
    utcOffsetHours: this.num(Validators.min(-12), Validators.max(14)),
    notes: this.fb.control('', [Validators.maxLength(4000)]),
    publishedValues: this.fb.group({
      source: this.fb.control('', [Validators.required, Validators.maxLength(500)]),
      period: this.fb.group({ firstYear: this.num(), lastYear: this.num() }),
      heating: this.fb.group({ db99_6: this.num(Validators.required), db99: this.num(Validators.required) }),
      cooling: this.fb.group({ db0_4: this.num(), db1: this.num(), db2: this.num() }),
      extremeMin: this.fb.group({
        mean: this.num(),
        sd: this.num(Validators.min(0)),
        returnPeriod: this.fb.group({ '5': this.num(), '10': this.num(), '20': this.num(), '50': this.num() }),
      }),
      humidification: this.fb.group({ dp99_6: this.humidification(), dp99: this.humidification() }),
      wind: this.fb.group({
        coldestMonth: this.num(),
        coldestMonth1: this.num(Validators.min(0)),
        coincident99_6: this.num(Validators.min(0)),
        annual1: this.num(Validators.min(0)),
        annual2_5: this.num(Validators.min(0)),
        annual5: this.num(Validators.min(0)),
      }),
      hdd18: this.num(Validators.min(0)),
    }),
  });

  constructor() {
    // Switching units while typing: the numbers already in the form follow.
    effect(() => {
      const system = this.auth.unitSystem();
      const previous = untracked(() => this.formSystem());
      if (system === previous) return;
      for (const field of ALL_NUMBER_FIELDS) {
        const control = this.numberControl(field);
        if (!field.quantity || control.value === null) continue;
        const si = toSi(field.quantity, control.value, previous);
        control.setValue(roundConverted(fromSi(field.quantity, si, system), 2));
      }
      this.formSystem.set(system);
    });
  }

  ngOnInit(): void {
    const site = this.site();
    if (site) this.fill(site);
    if (this.kind() === 'hourly') this.form.controls.publishedValues.disable();
  }

  protected numberControl(field: NumberField): FormControl<number | null> {
    const control = this.form.get(field.path);
    if (!(control instanceof FormControl)) throw new Error(`No form control at ${field.path}`);
    return control as FormControl<number | null>;
  }

  protected label(field: NumberField): string {
    return fieldLabel(field, this.formSystem());
  }

  protected required(field: NumberField): string {
    return `Enter the ${field.label.toLowerCase()}`;
  }

  protected async submit(): Promise<void> {
    if (this.pending()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      this.formError.set('Some values need attention; see the marked fields.');
      return;
    }
    this.pending.set(true);
    this.formError.set('');
    try {
      const site = this.site();
      const body = this.body();
      const saved = site
        ? await this.api.update(site.id, body satisfies ClimateSitePatch)
        : await this.api.create({ ...body, sourceKind: this.kind() } satisfies ClimateSiteInput);
      this.saved.emit(saved);
    } catch (err) {
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
    }
  }

  /** The request body in SI (site fields, and the published values for published sites). */
  private body(): Omit<ClimateSiteInput, 'sourceKind'> {
    const system = this.formSystem();
    const raw = this.form.getRawValue();
    const si = (field: NumberField): number | null => {
      const value = this.numberControl(field).value;
      if (value === null || !Number.isFinite(value)) return null;
      return field.quantity && system !== 'SI' ? roundConverted(toSi(field.quantity, value, system)) : value;
    };
    const location = Object.fromEntries(LOCATION_FIELDS.map((f) => [f.path, si(f)])) as Record<
      'latitude' | 'longitude' | 'elevationM' | 'utcOffsetHours',
      number | null
    >;
    const body: Omit<ClimateSiteInput, 'sourceKind'> = { name: raw.name.trim(), ...location, notes: raw.notes.trim() };
    if (this.kind() !== 'published') return body;

    const published: Record<string, unknown> = { source: raw.publishedValues.source.trim() };
    if (location.elevationM !== null) published['elevation'] = location.elevationM;
    for (const field of [...PERIOD_FIELDS, ...PUBLISHED_SECTIONS.flatMap((s) => s.fields)]) {
      const value = si(field);
      if (value !== null) writePath(published, field.path.slice(PUBLISHED_PREFIX.length), value);
    }
    const month = raw.publishedValues.wind.coldestMonth;
    if (month !== null) writePath(published, 'wind.coldestMonth', month);
    return { ...body, publishedValues: published as unknown as PublishedDesignValues };
  }

  /** Puts a stored site into the form, in the user's units. */
  private fill(site: ClimateSite): void {
    const system = this.formSystem();
    const published = site.publishedValues;
    this.form.patchValue({
      name: site.name,
      notes: site.notes,
      publishedValues: {
        source: published?.source ?? '',
        wind: { coldestMonth: published?.wind?.coldestMonth ?? null },
      },
    });
    for (const field of ALL_NUMBER_FIELDS) {
      const stored = field.path.startsWith(PUBLISHED_PREFIX)
        ? readPath(published, field.path.slice(PUBLISHED_PREFIX.length))
        : field.path === 'elevationM'
          ? (site.elevationM ?? published?.elevation)
          : readPath(site, field.path);
      if (typeof stored !== 'number') continue;
      const shown = field.quantity ? roundConverted(fromSi(field.quantity, stored, system), 2) : stored;
      this.numberControl(field).setValue(shown);
    }
  }
}
