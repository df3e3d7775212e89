import { ChangeDetectionStrategy, ChangeDetectorRef, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { applyApiErrors, fieldError, saveFailure } from '../../core/api-errors';

export interface NameDialogData<T> {
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
  /** Saves the name (and the choice, when asked); the dialog closes with its answer, or shows the error and stays open. */
  save: (name: string, choice: string) => Promise<T>;
  /**
   * For a rename: loads the thing again after someone else saved it first (409 `stale_update`), so
   * that the typed name can be saved over the latest version. The dialog then offers "Reload".
   */
  reload?: () => Promise<void>;
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
        @if (formError()) {
          <div class="tr-alert" role="alert">
            <span>{{ formError() }}</span>
            @if (stale()) {
              <button mat-button type="button" [disabled]="pending()" (click)="reload()">Reload</button>
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
          <mat-error>{{ fieldError(form.controls.name, { required: data.requiredMessage ?? 'Enter a name' }) }}</mat-error>
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
        <button mat-flat-button type="submit" [disabled]="pending()">{{ data.submitLabel }}</button>
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
export class NameDialog<T> {
  protected readonly data = inject<NameDialogData<T>>(MAT_DIALOG_DATA);
  private readonly dialogRef = inject<MatDialogRef<NameDialog<T>, T>>(MatDialogRef);
  private readonly cdr = inject(ChangeDetectorRef);
  protected readonly form = inject(NonNullableFormBuilder).group({
    name: [this.data.initial, [Validators.required, Validators.maxLength(this.data.maxLength)]],
    choice: [this.data.choice?.initial ?? ''],
  });
  protected readonly pending = signal(false);
  protected readonly formError = signal('');
  /** Someone else saved first (a rename with `reload`). */
  protected readonly stale = signal(false);
  protected readonly fieldError = fieldError;

  protected async submit(): Promise<void> {
    if (this.pending()) return;
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
    await this.run(async () => {
      this.dialogRef.close(await this.data.save(name, this.form.controls.choice.value));
    });
  }

  /** Loads the latest version through the caller's `reload`; the typed name stays. */
  protected async reload(): Promise<void> {
    const reload = this.data.reload;
    if (reload) await this.run(reload);
  }

  private async run(action: () => Promise<void>): Promise<void> {
    this.pending.set(true);
    this.formError.set('');
    this.stale.set(false);
    try {
      await action();
    } catch (err) {
      const place = (e: unknown) => applyApiErrors(this.form, e);
      // Without `reload` there is nothing to offer: a stale save is shown like any other failure.
      const failure = this.data.reload ? saveFailure(err, place) : { stale: false, message: place(err) };
      this.stale.set(failure.stale);
      this.formError.set(failure.message);
    } finally {
      this.pending.set(false);
      this.cdr.markForCheck();
    }
  }
}
