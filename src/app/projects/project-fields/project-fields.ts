import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { formatQuantity } from '@shared/units/units';
import { startWith, switchMap } from 'rxjs';
import { AuthStore } from '../../auth/auth-store';
import { fieldError } from '../../core/api-errors';
import type { ProjectDetailsForm } from '../project-form';
import type { ClimateSiteChoice } from '../projects-api';

/** The site a project points at, known from the project itself before the list of sites has loaded. */
export interface ClimateSiteRef {
  id: string;
  name: string;
}

/** The fields of a project's details; the parent owns the form and sends it. */
@Component({
  selector: 'app-project-fields',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule, MatSelectModule],
  template: `
    @let f = form();
    <div class="fields">
      <mat-form-field class="name" subscriptSizing="dynamic">
        <mat-label>Project name</mat-label>
        <input matInput [formControl]="f.controls.name" autocomplete="off" />
        <mat-hint>For example the street address or the client's name</mat-hint>
        <mat-error>{{ fieldError(f.controls.name, { required: 'Enter a project name' }) }}</mat-error>
      </mat-form-field>
      <mat-form-field>
        <mat-label>Client name</mat-label>
        <input matInput [formControl]="f.controls.clientName" autocomplete="off" />
        <mat-error>{{ fieldError(f.controls.clientName) }}</mat-error>
      </mat-form-field>
      <mat-form-field class="wide">
        <mat-label>Site address</mat-label>
        <textarea matInput rows="2" [formControl]="f.controls.siteAddress" autocomplete="off"></textarea>
        <mat-error>{{ fieldError(f.controls.siteAddress) }}</mat-error>
      </mat-form-field>
      <mat-form-field class="wide">
        <mat-label>Climate site</mat-label>
        <mat-select [formControl]="f.controls.climateSiteId">
          <mat-option [value]="null">None chosen yet</mat-option>
          @for (s of choices(); track s.id) {
            <mat-option [value]="s.id"
              >{{ s.name }}{{ s.isDemo && !s.name.includes('(invented') ? ' (invented demo)' : '' }}</mat-option
            >
          }
        </mat-select>
        @if (selectedHint(); as hint) {
          <mat-hint>{{ hint }}</mat-hint>
        } @else {
          <mat-hint>Where the outdoor design temperature comes from</mat-hint>
        }
        <mat-error>{{ fieldError(f.controls.climateSiteId) }}</mat-error>
      </mat-form-field>
      <mat-form-field class="wide">
        <mat-label>Notes</mat-label>
        <textarea matInput rows="4" [formControl]="f.controls.notes"></textarea>
        <mat-error>{{ fieldError(f.controls.notes) }}</mat-error>
      </mat-form-field>
    </div>
  `,
  styles: `
    .fields {
      display: grid;
      grid-template-columns: repeat(2, minmax(0, 1fr));
      gap: 0.5rem 1rem;
    }

    .wide {
      grid-column: 1 / -1;
    }

    @media (max-width: 599.98px) {
      .fields {
        grid-template-columns: minmax(0, 1fr);
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectFields {
  // services
  private readonly auth = inject(AuthStore);

  readonly form = input.required<ProjectDetailsForm>();
  /** The organisation's climate sites (empty while loading). */
  readonly sites = input<readonly ClimateSiteChoice[]>([]);
  /** The site the project points at now, so the select can show it before the list arrives. */
  readonly currentSite = input<ClimateSiteRef | null>(null);

  protected readonly fieldError = fieldError;

  protected readonly choices = computed<ClimateSiteChoice[]>(() => {
    const sites = [...this.sites()];
    const current = this.currentSite();
    if (current && !sites.some((s) => s.id === current.id)) {
      sites.unshift({ id: current.id, name: current.name, isDemo: false, heatingDb99_6: null });
    }
    return sites;
  });

  private readonly selectedId = toSignal(
    toObservable(this.form).pipe(
      switchMap((f) => f.controls.climateSiteId.valueChanges.pipe(startWith(f.controls.climateSiteId.value))),
    ),
    { initialValue: null },
  );

  /** The chosen site's heating design temperature, as a reminder of what the choice means. */
  protected readonly selectedHint = computed(() => {
    const id = this.selectedId();
    const site = id ? this.sites().find((s) => s.id === id) : undefined;
    const value = site?.heatingDb99_6 ?? null;
    if (value === null) return '';
    return `Heating 99.6 %: ${formatQuantity('temperature', value, this.auth.unitSystem())}`;
  });
}
