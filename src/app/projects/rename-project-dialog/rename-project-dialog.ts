import { ChangeDetectionStrategy, ChangeDetectorRef, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { PROJECT_NAME_MAX_LENGTH, type Project } from '@shared/projects/project-schemas';
import { apiErrorCode, apiErrorMessage, applyApiErrors, fieldError } from '../../core/api-errors';
import { ProjectsApi } from '../projects-api';

export interface RenameProjectDialogData {
  project: Project;
}

/** Changes a project's name and closes with the saved project. */
@Component({
  selector: 'app-rename-project-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  template: `
    <h2 mat-dialog-title>Rename project</h2>
    <form [formGroup]="form" (ngSubmit)="rename()" novalidate>
      <mat-dialog-content>
        @if (formError()) {
          <div class="tr-alert" role="alert">
            <span>{{ formError() }}</span>
            @if (stale()) {
              <button mat-button type="button" [disabled]="pending()" (click)="reload()">Reload</button>
            }
          </div>
        }
        <mat-form-field class="name">
          <mat-label>Project name</mat-label>
          <input matInput formControlName="name" cdkFocusInitial autocomplete="off" />
          <mat-error>{{ fieldError(form.controls.name, { required: 'Enter a project name' }) }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="pending()">Rename</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .name {
      width: min(360px, 100%);
      padding-top: 0.25rem;
    }

    .tr-alert {
      align-items: center;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RenameProjectDialog {
  // services
  private readonly api = inject(ProjectsApi);
  private readonly dialogRef = inject<MatDialogRef<RenameProjectDialog, Project>>(MatDialogRef);
  private readonly cdr = inject(ChangeDetectorRef);
  private readonly data = inject<RenameProjectDialogData>(MAT_DIALOG_DATA);

  /** The project as last loaded: its version is the one a save is made from. */
  private project = this.data.project;

  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.project.name, [Validators.required, Validators.maxLength(PROJECT_NAME_MAX_LENGTH)]],
  });
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  /** Someone saved the project since it was loaded. */
  protected readonly stale = signal(false);
  protected readonly fieldError = fieldError;

  protected async rename(): Promise<void> {
    if (this.pending()) return;
    const name = this.form.controls.name.value.trim();
    if (!name) this.form.controls.name.setValue('');
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    if (name === this.project.name) {
      this.dialogRef.close();
      return;
    }
    await this.run(async () => {
      this.dialogRef.close(await this.api.update(this.project.id, { version: this.project.version, name }));
    });
  }

  /** Loads the project again; the typed name stays so it can be saved over the latest version. */
  protected async reload(): Promise<void> {
    await this.run(async () => {
      this.project = await this.api.get(this.project.id);
    });
  }

  private async run(action: () => Promise<void>): Promise<void> {
    this.pending.set(true);
    this.formError.set('');
    this.stale.set(false);
    try {
      await action();
    } catch (err) {
      if (apiErrorCode(err) === 'stale_update') {
        this.stale.set(true);
        this.formError.set(apiErrorMessage(err));
      } else {
        this.formError.set(applyApiErrors(this.form, err));
      }
    } finally {
      this.pending.set(false);
      this.cdr.markForCheck();
    }
  }
}
