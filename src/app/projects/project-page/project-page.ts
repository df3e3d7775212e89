import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RouterLink } from '@angular/router';
import type { Project } from '@shared/projects/project-schemas';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorCode, applyApiErrors } from '../../core/api-errors';
import { VersionedEdit } from '../../core/versioned-edit';
import { BuildingSection } from '../../building/building-section/building-section';
import { EquipmentListSelect } from '../../building/equipment-list-select/equipment-list-select';
import { ProjectFields, type ClimateSiteRef } from '../project-fields/project-fields';
import {
  checkProjectDetails,
  fillProjectDetails,
  projectDetailsForm,
  projectDetailsValue,
  type ProjectDetails,
} from '../project-form';
import { ProjectsApi, type ClimateSiteChoice } from '../projects-api';
import { ScenarioList } from '../../scenarios/scenario-list/scenario-list';

type DetailKey = keyof ProjectDetails;

const DETAIL_LABELS: Record<DetailKey, string> = {
  name: 'Project name',
  clientName: 'Client name',
  siteAddress: 'Site address',
  climateSiteId: 'Climate site',
  notes: 'Notes',
};

/** A value the user typed that was not saved because someone else saved first. */
interface UnsavedChange {
  key: DetailKey;
  label: string;
  text: string;
  value: string | null;
}

/** `/projects/:id`: a project's details, its equipment list, its building and its scenarios. */
@Component({
  selector: 'app-project-page',
  imports: [
    DatePipe,
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatChipsModule,
    MatIconModule,
    MatProgressBarModule,
    BuildingSection,
    EquipmentListSelect,
    ProjectFields,
    ScenarioList,
  ],
  templateUrl: './project-page.html',
  styleUrl: './project-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectPage {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly api = inject(ProjectsApi);
  private readonly snackBar = inject(MatSnackBar);

  /** Route parameter. */
  readonly id = input.required<string>();

  protected readonly loaded = this.api.projectResource(() => this.id());
  protected readonly notFound = computed(() => apiErrorCode(this.loaded.error()) === 'not_found');
  private readonly siteChoices = this.api.climateSiteChoicesResource();
  protected readonly sites = computed<ClimateSiteChoice[]>(() =>
    this.siteChoices.hasValue() ? this.siteChoices.value() : [],
  );

  protected readonly form = projectDetailsForm(inject(NonNullableFormBuilder));
  /** Saves the details over the project's `version`; after someone else saved, reloads theirs. */
  protected readonly edit = new VersionedEdit<Project>({
    load: (p) => this.api.get(p.id),
    placeErrors: (e) => applyApiErrors(this.form, e),
  });
  /** The project as last loaded or saved; the form's changes are made from its `version`. */
  protected readonly project = this.edit.record;
  protected readonly currentSite = computed<ClimateSiteRef | null>(() => {
    const p = this.project();
    return p?.climateSiteId ? { id: p.climateSiteId, name: p.climateSiteName ?? 'Chosen climate site' } : null;
  });
  protected readonly canWrite = computed(() => this.auth.can('project:write'));

  /** The user's values that were replaced by the latest saved version on reload. */
  protected readonly unsaved = signal<UnsavedChange[]>([]);

  constructor() {
    effect(() => {
      if (!this.loaded.hasValue()) return;
      const project = this.loaded.value();
      untracked(() => this.show(project));
    });
    effect(() => {
      if (this.canWrite()) this.form.enable();
      else this.form.disable();
    });
  }

  protected async save(): Promise<void> {
    if (!this.project() || this.edit.isPending() || !this.canWrite()) return;
    if (!checkProjectDetails(this.form)) return;
    // A stale save keeps the typed values in the form; Reload shows the latest version and keeps them aside.
    const saved = await this.edit.save((base) =>
      this.api.update(base.id, { version: base.version, ...projectDetailsValue(this.form) }),
    );
    if (!saved) return;
    this.show(saved);
    this.unsaved.set([]);
    this.snackBar.open('Project saved', 'Close', { duration: 4000 });
  }

  /** Loads the latest saved version into the form and keeps the user's own changes ready to apply again. */
  protected async reload(): Promise<void> {
    const base = this.project();
    if (!base) return;
    const typed = projectDetailsValue(this.form);
    const latest = await this.edit.reload();
    if (!latest) return;
    const changes = this.changesFrom(typed, latest, base);
    this.show(latest);
    this.unsaved.set(changes);
  }

  /** Puts the changes kept aside on reload back into the form, to be saved over the latest version. */
  protected applyUnsaved(): void {
    for (const change of this.unsaved()) {
      const control = this.form.controls[change.key];
      control.setValue(change.value as never);
      control.markAsDirty();
    }
    this.unsaved.set([]);
  }

  protected discardUnsaved(): void {
    this.unsaved.set([]);
  }

  /** Puts the form back to the project as saved. */
  protected discardChanges(): void {
    const project = this.project();
    if (project) this.show(project);
    this.edit.clear();
  }

  /** The project as saved by the equipment select; the details form keeps what the user is typing. */
  protected adopt(project: Project): void {
    if (this.form.dirty) this.project.set(project);
    else this.show(project);
  }

  /** The building was saved: the project moved on one version, its details unchanged. */
  protected buildingSaved(version: number): void {
    this.project.update((p) => (p ? { ...p, version } : p));
  }

  private show(project: Project): void {
    this.project.set(project);
    fillProjectDetails(this.form, project);
    if (!this.canWrite()) this.form.disable();
  }

  /** The fields the user changed from `base` that the latest version does not already hold. */
  private changesFrom(typed: ProjectDetails, latest: Project, base: Project): UnsavedChange[] {
    const changes: UnsavedChange[] = [];
    for (const key of Object.keys(DETAIL_LABELS) as DetailKey[]) {
      const value = typed[key] ?? null;
      // Only what the user changed, and only where the latest version differs from it.
      if (value === (base[key] ?? null) || value === (latest[key] ?? null)) continue;
      changes.push({ key, label: DETAIL_LABELS[key], text: this.describe(key, value, base), value });
    }
    return changes;
  }

  private describe(key: DetailKey, value: string | null, base: Project): string {
    if (key !== 'climateSiteId') return value === null || value === '' ? '(empty)' : value;
    if (value === null) return 'None chosen';
    const site = this.sites().find((s) => s.id === value);
    return site?.name ?? (value === base.climateSiteId ? base.climateSiteName : null) ?? 'Another climate site';
  }
}
