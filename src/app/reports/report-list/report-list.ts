import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, resource } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { UnitSystem } from '@shared/units/units';
import type { Report } from '@shared/reports/report-schemas';
import type { SweepAnswer } from '@shared/scenarios/scenario-schemas';
import { ReportComposer, type ReportComposerData } from '../report-composer/report-composer';
import { ProjectsApi } from '../../projects/projects-api';
import { ReportsApi } from '../reports-api';

/** The trade-off page's client reports of its scenario, and the start of a new one. */
@Component({
  selector: 'app-report-list',
  imports: [DatePipe, RouterLink, MatButtonModule, MatIconModule],
  template: `
    <section class="reports" aria-labelledby="reports-title" data-testid="report-list">
      <div class="head">
        <h2 id="reports-title">Client reports</h2>
        @if (canWrite() && sweep()) {
          <button mat-flat-button type="button" (click)="compose()">
            <mat-icon>description</mat-icon>New client report
          </button>
        }
      </div>
      <p class="lead">
        A homeowner-readable page and PDF of two or three design points, shared by an expiring link or e-mail.
      </p>
      @if (reports().length === 0) {
        <p class="empty">No reports of this scenario yet.</p>
      } @else {
        <ul>
          @for (r of reports(); track r.id) {
            <li>
              <a [routerLink]="['/projects', projectId(), 'reports', r.id]">{{ r.title }}</a>
              <span class="meta"
                >{{ r.createdAt | date: 'medium' }} · {{ r.sends.length }} sent · {{ activeLinks(r) }} active
                links</span
              >
            </li>
          }
        </ul>
      }
    </section>
  `,
  styles: `
    .reports {
      margin-top: 1.5rem;
    }
    .head {
      display: flex;
      flex-wrap: wrap;
      justify-content: space-between;
      align-items: center;
      gap: 0.5rem;
      h2 {
        margin: 0;
      }
    }
    .lead,
    .empty,
    .meta {
      color: var(--mat-sys-on-surface-variant);
    }
    ul {
      padding-left: 1.25rem;
    }
    li a {
      font-weight: 600;
      margin-right: 0.5rem;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReportList {
  readonly projectId = input.required<string>();
  readonly scenarioId = input.required<string>();
  readonly scenarioName = input.required<string>();
  readonly sweep = input<SweepAnswer | null>(null);
  readonly chosenC = input<number | null>(null);
  readonly unitSystem = input.required<UnitSystem>();
  readonly canWrite = input.required<boolean>();

  private readonly api = inject(ReportsApi);
  private readonly projects = inject(ProjectsApi);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);
  private readonly loaded = resource({
    params: () => ({ projectId: this.projectId(), scenarioId: this.scenarioId() }),
    loader: ({ params }) => this.api.list(params.projectId, params.scenarioId),
  });
  /** The scenario's reports; none while they load or when they could not be loaded. */
  protected readonly reports = computed<Report[]>(() => (this.loaded.hasValue() ? this.loaded.value() : []));

  protected activeLinks(r: Report): number {
    return r.links.filter((l) => l.status === 'active').length;
  }

  protected async compose(): Promise<void> {
    const sweep = this.sweep();
    if (!sweep) return;
    const project = await this.projects.get(this.projectId()).catch(() => null);
    const data: ReportComposerData = {
      projectId: this.projectId(),
      scenarioId: this.scenarioId(),
      scenarioName: this.scenarioName(),
      defaultTitle: project
        ? `Heating options for ${project.clientName || project.name}`
        : 'Heating options for your home',
      sweep,
      chosenC: this.chosenC() ?? sweep.rows[0]?.designC ?? 0,
      unitSystem: this.unitSystem(),
    };
    const created = await firstValueFrom(
      this.dialog
        .open<ReportComposer, ReportComposerData, Report>(ReportComposer, { data, width: '560px', maxWidth: '95vw' })
        .afterClosed(),
    );
    if (created) await this.router.navigate(['/projects', this.projectId(), 'reports', created.id]);
  }
}
