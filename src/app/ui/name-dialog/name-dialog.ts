import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { applyApiErrors, fieldError } from '../../core/api-errors';
import { VersionedEdit } from '../../core/versioned-edit';

export interface NameDialogData<T, R = unknown> {
  title: string;
  /** Label of the name field, e.g. "Scenario name". */
  label: string;
  initial: string;
  submitLabel: string;
  maxLength: number;
  /** An optional line under the title. */
  hint?: string;
  /** An optional hint under the field, e.g. an example name. */
  fieldHint?: string;
  /** The message when the name is left empty (default "Enter a name"). */
  requiredMessage?: string;
  /** `data-testid` of the input. */
  testId?: string;
  /** The input's autocomplete token (default "off"). */
  autocomplete?: string;
  /** An optional question asked with the name, answered by one of its choices. */
  choice?: { legend: string; options: readonly { value: string; label: string }[]; initial: string; testId?: string };
  /**
   * Saves the name (and the choice, when asked) over `current`, the renamed thing as last loaded
   * (null without `versioned`); the dialog closes with its answer, or shows the error and stays open.
   */
  save: (name: string, choice: string, current: R | null) => Promise<T>;
  /**
   * For a rename: the thing as the caller loaded it, and how to load it again after someone else
   * saved it first (409 `stale_update`), so that the typed name can be saved over the latest
   * version. The dialog then offers "Reload".
   */
  versioned?: { record: R; load: (current: R) => Promise<R> };
  /** Close without saving when the name is left as it was (a rename). */
  closeIfUnchanged?: boolean;
}

/** Asks for a name and saves it through the caller's `save`; closes with what `save` answered. */
@Component({
  selector: 'app-name-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule, MatRadioModule],
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content>
        @if (data.hint) {
          <p class="hint">{{ data.hint }}</p>
        }
        @if (edit.error()) {
          <div class="tr-alert" role="alert">
            <span>{{ edit.error() }}</span>
            @if (edit.isStale()) {
              <button mat-button type="button" [disabled]="edit.isPending()" (click)="reload()">Reload</button>
            }
          </div>
        }
        <mat-form-field class="name">
          <mat-label>{{ data.label }}</mat-label>
          <input
            matInput
            formControlName="name"
            cdkFocusInitial
            [attr.autocomplete]="data.autocomplete ?? 'off'"
            [attr.data-testid]="data.testId ?? null"
          />
          @if (data.fieldHint) {
            <mat-hint>{{ data.fieldHint }}</mat-hint>
          }
          <mat-error>{{
            fieldError(form.controls.name, { required: data.requiredMessage ?? 'Enter a name' })
          }}</mat-error>
        </mat-form-field>
        @if (data.choice; as c) {
          <fieldset class="choice">
            <legend>{{ c.legend }}</legend>
            <mat-radio-group formControlName="choice" [attr.data-testid]="c.testId ?? null">
              @for (o of c.options; track o.value) {
                <mat-radio-button [value]="o.value">{{ o.label }}</mat-radio-button>
              }
            </mat-radio-group>
          </fieldset>
        }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="edit.isPending()">{{ data.submitLabel }}</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .name {
      width: min(400px, 100%);
      padding-top: 0.25rem;
    }
    .choice {
      border: 0;
      margin: 0;
      padding: 0;
    }
    .choice mat-radio-group {
      display: flex;
      flex-direction: column;
    }
    .hint {
      margin: 0 0 0.75rem;
      max-width: 400px;
    }
    .tr-alert {
      align-items: center;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class NameDialog<T, R = unknown> {
  protected readonly data = inject<NameDialogData<T, R>>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<NameDialog<T, R>, T>>(MatDialogRef);
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.data.initial, [Validators.required, Validators.maxLength(this.data.maxLength)]],
    choice: [this.data.choice?.initial ?? ''],
  });
  /** Without `versioned` a stale save is shown like any other failure: there is nothing to reload. */
  protected readonly edit = new VersionedEdit<R>({
    record: signal(this.data.versioned?.record ?? null),
    ...(this.data.versioned ? { load: this.data.versioned.load } : {}),
    placeErrors: (e) => applyApiErrors(this.form, e),
  });
  protected readonly fieldError = fieldError;

  protected async submit(): Promise<void> {
    if (this.edit.isPending()) return;
    const name = this.form.controls.name.value.trim();
    if (!name) this.form.controls.name.setValue('');
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    if (this.data.closeIfUnchanged && name === this.data.initial) {
      this.dialogRef.close();
      return;
    }
    const choice = this.form.controls.choice.value;
    const answer = await this.edit.send(() => this.data.save(name, choice, this.edit.record()));
    if (answer !== null) this.dialogRef.close(answer);
  }

  /** Loads the latest version through the caller's `load`; the typed name stays. */
  protected async reload(): Promise<void> {
    await this.edit.reload();
  }
}
