import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { RouterLink } from '@angular/router';
import { usageSchema, type Usage } from '@shared/billing/billing-schemas';
import type { Project } from '@shared/projects/project-schemas';
import { AuthStore } from '../../auth/auth-store';
import { applyApiErrors } from '../../core/api-errors';
import { ProjectFields } from '../project-fields/project-fields';
import { checkProjectDetails, projectDetailsForm, projectDetailsValue } from '../project-form';
import { ProjectsApi, type ClimateSiteChoice } from '../projects-api';

/** Asks for a project's details, creates the project and closes with it. */
@Component({
  selector: 'app-new-project-dialog',
  imports: [ReactiveFormsModule, RouterLink, MatButtonModule, MatDialogModule, ProjectFields],
  template: `
    <h2 mat-dialog-title>New project</h2>
    <form [formGroup]="form" (ngSubmit)="create()" novalidate>
      <mat-dialog-content>
        @if (atLimit(); as u) {
          <p class="tr-note limit" role="note" data-testid="plan-limit">
            The {{ u.planName }} plan holds {{ u.projects.limit }} active projects, and all are in use.
            @if (canUpgrade()) {
              <a routerLink="/billing" mat-dialog-close>Upgrade on Plan &amp; billing</a>, or archive a project.
            } @else {
              Ask an owner to upgrade the plan, or archive a project.
            }
          </p>
        }
        @if (formError()) {
          <p class="tr-alert" role="alert">{{ formError() }}</p>
        }
        <app-project-fields [form]="form" [sites]="sites()" />
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="pending() || atLimit() !== null">Create project</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    app-project-fields {
      display: block;
      width: min(560px, 100%);
      padding-top: 0.25rem;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewProjectDialog {
  // services
  private readonly api = inject(ProjectsApi);
  private readonly dialogRef = inject<MatDialogRef<NewProjectDialog, Project>>(MatDialogRef);

  protected readonly form = projectDetailsForm(inject(NonNullableFormBuilder));
  private readonly siteChoices = this.api.climateSiteChoicesResource();
  protected readonly sites = computed<ClimateSiteChoice[]>(() =>
    this.siteChoices.hasValue() ? this.siteChoices.value() : [],
  );
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  /** The plan's project limit, shown before it is reached (the server enforces it either way). */
  private readonly usage = httpResource(() => '/api/v1/billing/usage', { parse: usageSchema.parse });
  protected readonly atLimit = computed<Usage | null>(() => {
    const u = this.usage.hasValue() ? this.usage.value() : null;
    return u && u.projects.limit !== null && u.projects.used >= u.projects.limit ? u : null;
  });
  private readonly auth = inject(AuthStore);
  protected readonly canUpgrade = computed(() => this.auth.can('billing:manage'));

  protected async create(): Promise<void> {
    if (this.pending()) return;
    if (!checkProjectDetails(this.form)) return;
    const { name, clientName, siteAddress, climateSiteId, notes } = projectDetailsValue(this.form);
    this.pending.set(true);
    this.formError.set('');
    try {
      const created = await this.api.create({
        name,
        // Only what was filled in: the server keeps its own defaults for the rest.
        ...(clientName ? { clientName } : {}),
        ...(siteAddress ? { siteAddress } : {}),
        ...(climateSiteId ? { climateSiteId } : {}),
        ...(notes ? { notes } : {}),
      });
      this.dialogRef.close(created);
    } catch (err) {
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
    }
  }
}
