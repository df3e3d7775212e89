import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import type { ClimateSite, SourceKind } from '@shared/climate/climate-schemas';
import { ClimateSiteForm } from '../climate-site-form/climate-site-form';

/** `/climate-sites/new?source=published|hourly`: creates a site of either kind. */
@Component({
  selector: 'app-climate-site-new-page',
  imports: [RouterLink, MatIconModule, ClimateSiteForm],
  template: `
    <section class="tr-page">
      <p class="back">
        <a routerLink="/climate-sites"><mat-icon aria-hidden="true">arrow_back</mat-icon>Climate sites</a>
      </p>
      <header class="tr-page-header">
        <h1>{{ kind() === 'hourly' ? 'New site from hourly data' : 'New site from published values' }}</h1>
      </header>
      @if (kind() === 'hourly') {
        <p class="tr-lede">
          Name the place and say where it is. Next you upload its hourly weather record (generic CSV or NOAA ISD-Lite
          files); Tailroom checks it and computes the design conditions.
        </p>
      } @else {
        <p class="tr-lede">
          Copy the design values of this place from a published table. The heating 99.6 % and 99 % dry-bulbs and the
          source are needed; leave out what the table does not give.
        </p>
      }
      @if (kind() === 'hourly') {
        <app-climate-site-form sourceKind="hourly" (saved)="created($event)" (cancelled)="cancel()" />
      } @else {
        <app-climate-site-form sourceKind="published" (saved)="created($event)" (cancelled)="cancel()" />
      }
    </section>
  `,
  styles: `
    .back a {
      display: inline-flex;
      align-items: center;
      gap: 0.25rem;
      text-decoration: none;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ClimateSiteNewPage {
  // services
  private readonly router = inject(Router);
  private readonly snackBar = inject(MatSnackBar);

  /** Query parameter `source`. */
  readonly source = input<string>();
  protected readonly kind = computed<SourceKind>(() => (this.source() === 'hourly' ? 'hourly' : 'published'));

  protected created(site: ClimateSite): void {
    this.snackBar.open(`Site “${site.name}” created`, 'Close', { duration: 4000 });
    const queryParams = site.sourceKind === 'hourly' ? { upload: '1' } : {};
    void this.router.navigate(['/climate-sites', site.id], { queryParams });
  }

  protected cancel(): void {
    void this.router.navigateByUrl('/climate-sites');
  }
}
