import { DatePipe } from '@angular/common';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { FormGroupDirective, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { LINK_DAYS_DEFAULT, LINK_DAYS_MAX, type Report, type ReportView } from '@shared/reports/report-schemas';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage, applyApiErrors, readApiError, fieldError } from '../../core/api-errors';
import { ConfirmDialog, type ConfirmDialogData } from '../../ui/confirm-dialog/confirm-dialog';
import { ReportDocument } from '../report-document/report-document';
import { ScenariosApi } from '../../scenarios/scenarios-api';
import { ReportsApi } from '../reports-api';

/** `/projects/:id/reports/:reportId`: share a client report by e-mail or link, manage its links, and preview it. */
@Component({
  selector: 'app-report-page',
  imports: [
    DatePipe,
    ReactiveFormsModule,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    ReportDocument,
  ],
  templateUrl: './report-page.html',
  styleUrl: './report-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReportPage {
  readonly id = input.required<string>();
  readonly reportId = input.required<string>();

  private readonly api = inject(ReportsApi);
  private readonly auth = inject(AuthStore);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly fb = inject(NonNullableFormBuilder);
  private readonly scenarios = inject(ScenariosApi);
  /** The send form's directive: resetting through it also clears its submitted state, so no field turns red after a send. */
  private readonly sendFormDirective = viewChild(FormGroupDirective);

  protected readonly canWrite = computed(() => this.auth.can('project:write'));
  protected readonly report = signal<Report | null>(null);
  protected readonly view = signal<ReportView | null>(null);
  protected readonly loadError = signal('');
  protected readonly pending = signal(false);
  protected readonly sendError = signal('');
  protected readonly newUrl = signal('');
  protected readonly daysMax = LINK_DAYS_MAX;
  protected readonly fieldError = fieldError;
  protected readonly sendForm = this.fb.group({
    to: ['', [Validators.required, Validators.email]],
    message: ['', Validators.maxLength(1000)],
    expiresInDays: [LINK_DAYS_DEFAULT, [Validators.required, Validators.min(1), Validators.max(LINK_DAYS_MAX)]],
  });
  protected readonly linkDays = this.fb.control(LINK_DAYS_DEFAULT, [
    Validators.required,
    Validators.min(1),
    Validators.max(LINK_DAYS_MAX),
  ]);

  constructor() {
    effect(() => {
      const projectId = this.id();
      const reportId = this.reportId();
      untracked(() => void this.load(projectId, reportId));
    });
  }

  private async load(projectId: string, reportId: string): Promise<void> {
    try {
      this.report.set(await this.api.get(projectId, reportId));
      this.view.set(await this.api.preview(projectId, reportId));
    } catch (err) {
      this.loadError.set(
        readApiError(err)?.code === 'not_found'
          ? 'This report was not found.'
          : apiErrorMessage(err, 'The report could not be loaded.'),
      );
    }
  }

  protected async send(): Promise<void> {
    const r = this.report();
    if (!r || this.pending()) return;
    if (this.sendForm.invalid) {
      this.sendForm.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.sendError.set('');
    try {
      const v = this.sendForm.getRawValue();
      this.report.set(
        await this.api.send(r.projectId, r.id, { to: v.to.trim(), message: v.message, expiresInDays: v.expiresInDays }),
      );
      this.snack.open(`Sent to ${v.to.trim()}`, undefined, { duration: 4000 });
      this.resetSendForm();
    } catch (err) {
      this.sendError.set(applyApiErrors(this.sendForm, err));
      await this.refresh();
    } finally {
      this.pending.set(false);
    }
  }

  private resetSendForm(): void {
    const blank = { to: '', message: '', expiresInDays: LINK_DAYS_DEFAULT };
    const directive = this.sendFormDirective();
    if (directive) directive.resetForm(blank);
    else this.sendForm.reset(blank);
  }

  /**
   * For a live report: freezes its scenario (a dated copy whose figures never change), makes the
   * same report of the frozen copy, sends that one, and opens it, so a sent report never changes
   * under the homeowner.
   */
  protected async freezeAndSend(): Promise<void> {
    const r = this.report();
    if (!r || this.pending() || r.scenarioFrozen) return;
    if (this.sendForm.invalid) {
      this.sendForm.markAllAsTouched();
      return;
    }
    this.pending.set(true);
    this.sendError.set('');
    const v = this.sendForm.getRawValue();
    try {
      const frozen = await this.scenarios.freeze(r.projectId, r.scenarioId);
      const copy = await this.api.create(r.projectId, {
        scenarioId: frozen.id,
        title: r.title,
        note: r.note,
        contactPhone: r.contactPhone,
        points: r.points,
        figures: r.figures,
        unitSystem: r.unitSystem,
      });
      const sent = await this.api.send(r.projectId, copy.id, {
        to: v.to.trim(),
        message: v.message,
        expiresInDays: v.expiresInDays,
      });
      this.resetSendForm();
      await this.router.navigate(['/projects', r.projectId, 'reports', sent.id]);
      this.snack.open(
        `Frozen and sent to ${v.to.trim()}. This is the frozen report; its figures never change.`,
        undefined,
        { duration: 6000 },
      );
    } catch (err) {
      this.sendError.set(applyApiErrors(this.sendForm, err));
    } finally {
      this.pending.set(false);
    }
  }

  protected async retry(sendId: string): Promise<void> {
    const r = this.report();
    if (!r) return;
    await this.act(async () => {
      this.report.set(await this.api.retry(r.projectId, r.id, sendId));
      this.snack.open('Sent again', undefined, { duration: 4000 });
    });
  }

  protected async createLink(): Promise<void> {
    const r = this.report();
    if (!r || this.linkDays.invalid || this.pending()) return;
    await this.act(async () => {
      const { url } = await this.api.createLink(r.projectId, r.id, this.linkDays.value);
      this.newUrl.set(url);
      await this.refresh();
    });
  }

  protected async copy(url: string): Promise<void> {
    try {
      await navigator.clipboard.writeText(url);
      this.snack.open('Link copied', undefined, { duration: 3000 });
    } catch {
      this.snack.open('Select the link and copy it', undefined, { duration: 4000 });
    }
  }

  protected async revoke(linkId: string): Promise<void> {
    const r = this.report();
    if (!r) return;
    const data: ConfirmDialogData = {
      title: 'Withdraw this link?',
      message: 'Anyone who opens it will see that the report is no longer available. Other links keep working.',
      confirmLabel: 'Withdraw',
    };
    const ok = await firstValueFrom(
      this.dialog.open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data }).afterClosed(),
    );
    if (!ok) return;
    await this.act(async () => {
      this.report.set(await this.api.revokeLink(r.projectId, r.id, linkId));
    });
  }

  protected async remove(): Promise<void> {
    const r = this.report();
    if (!r) return;
    const data: ConfirmDialogData = {
      title: 'Delete report?',
      message: `“${r.title}” and all its links will stop working.`,
      confirmLabel: 'Delete',
    };
    const ok = await firstValueFrom(
      this.dialog.open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data }).afterClosed(),
    );
    if (!ok) return;
    await this.act(async () => {
      await this.api.remove(r.projectId, r.id);
      await this.router.navigate(['/projects', r.projectId, 'scenarios', r.scenarioId]);
    });
  }

  private async refresh(): Promise<void> {
    const r = this.report();
    if (r) this.report.set(await this.api.get(r.projectId, r.id));
  }

  private async act(action: () => Promise<void>): Promise<void> {
    this.pending.set(true);
    try {
      await action();
    } catch (err) {
      this.snack.open(apiErrorMessage(err), 'Dismiss', { duration: 8000 });
    } finally {
      this.pending.set(false);
    }
  }
}
