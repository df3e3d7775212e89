import { ChangeDetectionStrategy, ChangeDetectorRef, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { PROJECT_NAME_MAX_LENGTH, type Project } from '@shared/projects/project-schemas';
import { applyApiErrors, fieldError } from '../../core/api-errors';
import { ProjectsApi } from '../projects-api';

/** Asks for a project name, creates the project and closes with it. */
@Component({
  selector: 'app-new-project-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>New project</h2>
    <form [formGroup]="form" (ngSubmit)="create()" novalidate>
      <mat-dialog-content>
        @if (formError()) {
          <p class="tr-alert" role="alert">{{ formError() }}</p>
        }
        <mat-form-field class="name">
          <mat-label>Project name</mat-label>
          <input matInput formControlName="name" cdkFocusInitial autocomplete="off" />
          <mat-hint>For example the street address or the client's name</mat-hint>
          <mat-error>{{ fieldError(form.controls.name, { required: 'Enter a project name' }) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="pending()">Create project</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .name {
      width: min(360px, 100%);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NewProjectDialog {
  // services
  private readonly api = inject(ProjectsApi);
  private readonly dialogRef = inject<MatDialogRef<NewProjectDialog, Project>>(MatDialogRef);
  private readonly cdr = inject(ChangeDetectorRef);

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: ['', [Validators.required, Validators.maxLength(PROJECT_NAME_MAX_LENGTH)]],
  });
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  protected readonly fieldError = fieldError;

  protected async create(): Promise<void> {
    if (this.pending()) return;
    const name = this.form.controls.name.value.trim();
    if (!name) this.form.controls.name.setValue('');
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.formError.set('');
    try {
      this.dialogRef.close(await this.api.create({ name }));
    } catch (err) {
      this.formError.set(applyApiErrors(this.form, err));
    } finally {
      this.pending.set(false);
      this.cdr.markForCheck();
    }
  }
}
