import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatChipsModule } from '@angular/material/chips';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import type { ClimateSiteSummary } from '@shared/climate/climate-schemas';
import { formatQuantity } from '@shared/units/units';
import { AuthStore } from '../../auth/auth-store';
import { SOURCE_LABELS, yearsLabel } from '../climate-format';
import { ClimateSitesApi } from '../climate-sites-api';

/** A table row: the summary plus the texts shown (and filtered on). */
interface SiteRow {
  site: ClimateSiteSummary;
  source: string;
  years: string;
  heating99_6: string;
  heating99: string;
  elevation: string;
}

@Component({
  selector: 'app-climate-site-list-page',
  imports: [
    DatePipe,
    RouterLink,
    MatButtonModule,
    MatChipsModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSortModule,
    MatTableModule,
  ],
  templateUrl: './climate-site-list-page.html',
  styleUrl: './climate-site-list-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ClimateSiteListPage {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly api = inject(ClimateSitesApi);

  protected readonly columns = ['name', 'source', 'years', 'heating99_6', 'heating99', 'elevation', 'updatedAt'];
  protected readonly sites = this.api.listResource();
  protected readonly canWrite = computed(() => this.auth.can('project:write'));
  protected readonly filter = signal('');

  protected readonly rows = computed<SiteRow[]>(() => {
    const system = this.auth.unitSystem();
    const sites = this.sites.hasValue() ? this.sites.value() : [];
    return sites.map((site) => ({
      site,
      source: SOURCE_LABELS[site.sourceKind],
      years: yearsLabel(site.firstYear, site.lastYear, site.qualifyingYearCount),
      heating99_6: formatQuantity('temperature', site.heatingDb99_6, system),
      heating99: formatQuantity('temperature', site.heatingDb99, system),
      elevation: formatQuantity('length', site.elevationM, system),
    }));
  });

  protected readonly dataSource = new MatTableDataSource<SiteRow>([]);
  private readonly sort = viewChild(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  constructor() {
    this.dataSource.sortingDataAccessor = (row, column) => {
      const s = row.site;
      switch (column) {
        case 'name':
          return s.name.toLocaleLowerCase();
        case 'source':
          return row.source;
        case 'years':
          return s.lastYear ?? -Infinity;
        case 'heating99_6':
          return s.heatingDb99_6 ?? Infinity;
        case 'heating99':
          return s.heatingDb99 ?? Infinity;
        case 'elevation':
          return s.elevationM ?? -Infinity;
        case 'updatedAt':
          return s.updatedAt;
        default:
          return '';
      }
    };
    this.dataSource.filterPredicate = (row, filter) =>
      [row.site.name, row.source, row.years, row.site.isDemo ? 'invented demo' : '']
        .join(' ')
        .toLocaleLowerCase()
        .includes(filter);

    effect(() => {
      this.dataSource.data = this.rows();
    });
    effect(() => {
      this.dataSource.filter = this.filter().trim().toLocaleLowerCase();
      this.dataSource.paginator?.firstPage();
    });
    effect(() => {
      this.dataSource.sort = this.sort() ?? null;
      this.dataSource.paginator = this.paginator() ?? null;
    });
  }

  protected onFilter(event: Event): void {
    this.filter.set((event.target as HTMLInputElement).value);
  }
}
