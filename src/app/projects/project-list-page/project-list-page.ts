import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, signal, viewChild } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginator, MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatSort, MatSortModule } from '@angular/material/sort';
import { MatTableDataSource, MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { PROJECT_NAME_MAX_LENGTH, type Project } from '@shared/projects/project-schemas';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage } from '../../core/api-errors';
import { ConfirmDialog, type ConfirmDialogData } from '../../ui/confirm-dialog/confirm-dialog';
import { NewProjectDialog } from '../new-project-dialog/new-project-dialog';
import { ProjectsApi } from '../projects-api';
import { NameDialog, type NameDialogData } from '../../ui/name-dialog/name-dialog';

@Component({
  selector: 'app-project-list-page',
  imports: [
    DatePipe,
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatMenuModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSlideToggleModule,
    MatSortModule,
    MatTableModule,
  ],
  templateUrl: './project-list-page.html',
  styleUrl: './project-list-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ProjectListPage {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly api = inject(ProjectsApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly router = inject(Router);

  /** Lists the archived projects instead of the active ones. */
  protected readonly showArchived = signal(false);
  protected readonly filter = signal('');
  protected readonly projects = this.api.listResource(() => this.showArchived());
  protected readonly rows = computed<Project[]>(() => (this.projects.hasValue() ? this.projects.value() : []));
  protected readonly canWrite = computed(() => this.auth.can('project:write'));
  protected readonly columns = computed(() => {
    const columns = ['name', 'clientName', 'climateSiteName', 'updatedByName', 'updatedAt'];
    return this.canWrite() ? [...columns, 'actions'] : columns;
  });

  /** Project ids with a change in flight. */
  protected readonly busy = signal<ReadonlySet<string>>(new Set());

  protected readonly dataSource = new MatTableDataSource<Project>([]);
  private readonly sort = viewChild(MatSort);
  private readonly paginator = viewChild(MatPaginator);

  constructor() {
    this.dataSource.sortingDataAccessor = (p, column) => {
      switch (column) {
        case 'name':
          return p.name.toLocaleLowerCase();
        case 'clientName':
          return p.clientName.toLocaleLowerCase();
        case 'climateSiteName':
          return (p.climateSiteName ?? '').toLocaleLowerCase();
        case 'updatedByName':
          return p.updatedByName.toLocaleLowerCase();
        case 'updatedAt':
          return p.updatedAt;
        default:
          return '';
      }
    };
    this.dataSource.filterPredicate = (p, filter) =>
      [p.name, p.clientName, p.siteAddress].join('\n').toLocaleLowerCase().includes(filter);

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

  protected setShowArchived(archived: boolean): void {
    this.showArchived.set(archived);
    this.dataSource.paginator?.firstPage();
  }

  protected isBusy(id: string): boolean {
    return this.busy().has(id);
  }

  protected openNewProject(): void {
    this.dialog
      .open<NewProjectDialog, undefined, Project>(NewProjectDialog, { autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((created) => {
        if (!created) return;
        this.snackBar.open(`Project “${created.name}” created`, 'Close', { duration: 4000 });
        // Open the new project: describing the building and the site is the next step.
        void this.router.navigate(['/projects', created.id]);
      });
  }

  protected async rename(project: Project): Promise<void> {
    const data: NameDialogData<Project, Project> = {
      title: 'Rename project',
      label: 'Project name',
      initial: project.name,
      submitLabel: 'Rename',
      maxLength: PROJECT_NAME_MAX_LENGTH,
      requiredMessage: 'Enter a project name',
      closeIfUnchanged: true,
      save: (name, _choice, current) => this.api.update(project.id, { version: (current ?? project).version, name }),
      versioned: { record: project, load: (p) => this.api.get(p.id) },
    };
    const renamed = await firstValueFrom(
      this.dialog
        .open<NameDialog<Project, Project>, NameDialogData<Project, Project>, Project>(NameDialog, {
          data,
          autoFocus: 'first-tabbable',
        })
        .afterClosed(),
    );
    if (!renamed) return;
    this.snackBar.open(`Project renamed to “${renamed.name}”`, 'Close', { duration: 4000 });
    this.projects.reload();
  }

  protected async duplicate(project: Project): Promise<void> {
    await this.withBusy(project.id, async () => {
      const copy = await this.api.duplicate(project.id);
      this.snackBar.open(`Project “${copy.name}” created`, 'Close', { duration: 4000 });
    });
  }

  protected async setArchived(project: Project, archived: boolean): Promise<void> {
    await this.withBusy(project.id, async () => {
      await this.api.update(project.id, { version: project.version, archived });
      const done = archived ? 'archived' : 'restored';
      this.snackBar.open(`Project “${project.name}” ${done}`, 'Close', { duration: 4000 });
    });
  }

  protected async remove(project: Project): Promise<void> {
    const data: ConfirmDialogData = {
      title: `Delete ${project.name}?`,
      message: 'This cannot be undone.',
      confirmLabel: 'Delete',
    };
    const confirmed = await firstValueFrom(
      this.dialog.open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data }).afterClosed(),
    );
    if (!confirmed) return;
    await this.withBusy(project.id, async () => {
      await this.api.remove(project.id);
      this.snackBar.open(`Project “${project.name}” deleted`, 'Close', { duration: 4000 });
    });
  }

  /** Runs a change to one project, reports a refusal, and loads the list again in every case. */
  private async withBusy(id: string, action: () => Promise<void>): Promise<void> {
    this.busy.update((s) => new Set(s).add(id));
    try {
      await action();
    } catch (err) {
      this.snackBar.open(apiErrorMessage(err), 'Close', { duration: 8000 });
    } finally {
      this.busy.update((s) => {
        const next = new Set(s);
        next.delete(id);
        return next;
      });
      this.projects.reload();
    }
  }
}
