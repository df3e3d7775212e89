import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal, untracked } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { ClimateSite } from '@shared/climate/climate-schemas';
import { formatQuantity } from '@shared/units/units';
import { firstValueFrom } from 'rxjs';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorCode, apiErrorMessage } from '../../core/api-errors';
import { ConfirmDialog, type ConfirmDialogData } from '../../ui/confirm-dialog/confirm-dialog';
import { ClimateBasisPanel } from '../climate-basis-panel/climate-basis-panel';
import { ClimateCharts } from '../climate-charts/climate-charts';
import { ClimateSiteForm } from '../climate-site-form/climate-site-form';
import {
  DESIGN_WARNING_TEXTS,
  SOURCE_LABELS,
  coordinatesLabel,
  utcOffsetLabel,
  yearsLabel,
  type LooseDesignValues,
} from '../climate-format';
import { ClimateSitesApi } from '../climate-sites-api';
import { DesignValuesTable } from '../design-values-table/design-values-table';
import { UploadDialog, type UploadDialogData } from '../upload-dialog/upload-dialog';

/** `/climate-sites/:id`: a site's design values, where they come from, and its record as charts. */
@Component({
  selector: 'app-climate-site-page',
  imports: [
    DatePipe,
    DecimalPipe,
    RouterLink,
    MatButtonModule,
    MatChipsModule,
    MatIconModule,
    MatProgressBarModule,
    ClimateBasisPanel,
    ClimateCharts,
    ClimateSiteForm,
    DesignValuesTable,
  ],
  templateUrl: './climate-site-page.html',
  styleUrl: './climate-site-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ClimateSitePage {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly api = inject(ClimateSitesApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  /** Route parameter. */
  readonly id = input.required<string>();
  /** Query parameter: `upload=1` opens the upload dialog once the site has loaded (after creating it). */
  readonly upload = input<string>();

  protected readonly site = this.api.siteResource(() => this.id());
  protected readonly current = computed<ClimateSite | null>(() => (this.site.hasValue() ? this.site.value() : null));
  protected readonly notFound = computed(() => apiErrorCode(this.site.error()) === 'not_found');
  protected readonly chartData = this.api.chartDataResource(() => {
    const site = this.current();
    // A published site with an estimated record has charts of that record too.
    return site?.computed ? site.id : undefined;
  });
  protected readonly noRecord = computed(() => apiErrorCode(this.chartData.error()) === 'no_record');

  protected readonly canWrite = computed(() => this.auth.can('project:write'));
  protected readonly editing = signal(false);
  protected readonly busy = signal(false);

  /** The values to show: computed from the record, or as published. */
  protected readonly values = computed<LooseDesignValues | null>(() => {
    const site = this.current();
    if (!site) return null;
    return site.sourceKind === 'hourly' ? (site.computed?.conditions ?? null) : site.publishedValues;
  });

  protected readonly facts = computed(() => {
    const site = this.current();
    if (!site) return [];
    const system = this.auth.unitSystem();
    const facts = [
      coordinatesLabel(site.latitude, site.longitude),
      site.elevationM === null ? '' : `Elevation ${formatQuantity('length', site.elevationM, system)}`,
      utcOffsetLabel(site.utcOffsetHours),
      SOURCE_LABELS[site.sourceKind],
    ];
    return facts.filter((f) => f !== '');
  });

  protected readonly record = computed(() => {
    const computedValues = this.current()?.computed;
    if (!computedValues) return null;
    const { period } = computedValues.conditions;
    return {
      years: yearsLabel(period.firstYear, period.lastYear, null),
      qualifying: period.qualifyingYears.length,
      validHours: period.validHours,
      fileName: computedValues.fileName,
      rowCount: computedValues.rowCount,
      methodVersion: computedValues.methodVersion,
      computedAt: computedValues.computedAt,
      warnings: computedValues.conditions.warnings.map((code) => DESIGN_WARNING_TEXTS[code] ?? code),
    };
  });

  protected readonly publishedPeriod = computed(() => {
    const period = this.current()?.publishedValues?.period;
    return period ? yearsLabel(period.firstYear ?? null, period.lastYear ?? null, null) : '—';
  });

  private uploadOffered = false;

  constructor() {
    // Straight after creating an hourly site, its page opens the upload dialog once.
    effect(() => {
      const site = this.current();
      if (this.upload() !== '1' || !site || untracked(() => this.uploadOffered)) return;
      this.uploadOffered = true;
      void this.router.navigate([], { queryParams: { upload: null }, queryParamsHandling: 'merge', replaceUrl: true });
      if (site.sourceKind === 'hourly' && untracked(() => this.canWrite())) untracked(() => this.openUpload(site));
    });
  }

  protected openUpload(site: ClimateSite): void {
    this.dialog
      .open<UploadDialog, UploadDialogData, ClimateSite>(UploadDialog, {
        data: { siteId: site.id, siteName: site.name },
        disableClose: true,
        width: '760px',
        maxWidth: '96vw',
        autoFocus: 'dialog',
      })
      .afterClosed()
      .subscribe((stored) => {
        if (!stored) return;
        this.site.set(stored);
        this.chartData.reload();
        this.snackBar.open('Record stored; the design conditions are computed', 'Close', { duration: 5000 });
      });
  }

  protected estimated(site: ClimateSite): void {
    this.site.set(site);
    this.snackBar.open('Hour-by-hour record estimated', 'Close', { duration: 5000 });
  }

  protected saved(site: ClimateSite): void {
    this.site.set(site);
    this.editing.set(false);
    this.snackBar.open('Changes saved', 'Close', { duration: 3000 });
  }

  protected async remove(site: ClimateSite): Promise<void> {
    const data: ConfirmDialogData = {
      title: `Delete ${site.name}?`,
      message:
        site.sourceKind === 'hourly'
          ? 'The site, its stored hourly record and its design values will be deleted. This cannot be undone.'
          : 'The site and its design values will be deleted. This cannot be undone.',
      confirmLabel: 'Delete',
    };
    const confirmed = await firstValueFrom(
      this.dialog.open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data }).afterClosed(),
    );
    if (!confirmed) return;
    this.busy.set(true);
    try {
      await this.api.remove(site.id);
      this.snackBar.open(`Site “${site.name}” deleted`, 'Close', { duration: 4000 });
      await this.router.navigateByUrl('/climate-sites');
    } catch (err) {
      this.snackBar.open(apiErrorMessage(err), 'Close', { duration: 6000 });
    } finally {
      this.busy.set(false);
    }
  }
}
