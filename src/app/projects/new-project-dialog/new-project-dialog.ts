import { ChangeDetectionStrategy, ChangeDetectorRef, Component, computed, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import type { Project } from '@shared/projects/project-schemas';
import { applyApiErrors } from '../../core/api-errors';
import { ProjectFields } from '../project-fields/project-fields';
import { checkProjectDetails, projectDetailsForm, projectDetailsValue } from '../project-form';
import { ProjectsApi, type ClimateSiteChoice } from '../projects-api';

/** Asks for a project's details, creates the project and closes with it. */
@Component({
  selector: 'app-new-project-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, ProjectFields],
  template: `
    <h2 mat-dialog-title>New project</h2>
    <form [formGroup]="form" (ngSubmit)="create()" novalidate>
      <mat-dialog-content>
        @if (formError()) {
          <p class="tr-alert" role="alert">{{ formError() }}</p>
        }
        <app-project-fields [form]="form" [sites]="sites()" />
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="pending()">Create project</button>
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
  private readonly cdr = inject(ChangeDetectorRef);

  protected readonly form = projectDetailsForm(inject(NonNullableFormBuilder));
  private readonly siteChoices = this.api.climateSiteChoicesResource();
  protected readonly sites = computed<ClimateSiteChoice[]>(() =>
    this.siteChoices.hasValue() ? this.siteChoices.value() : [],
  );
  protected readonly pending = signal(false);
  protected readonly formError = signal('');

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
      this.cdr.markForCheck();
    }
  }
}
