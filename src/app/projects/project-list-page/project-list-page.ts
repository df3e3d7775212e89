import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import type { Project } from '@shared/projects/project-schemas';
import { AuthStore } from '../../auth/auth-store';
import { NewProjectDialog } from '../new-project-dialog/new-project-dialog';
import { ProjectsApi } from '../projects-api';

@Component({
  selector: 'app-project-list-page',
  imports: [DatePipe, MatButtonModule, MatIconModule, MatProgressBarModule, MatTableModule],
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

  protected readonly columns = ['name', 'createdByName', 'createdAt'];
  protected readonly projects = this.api.listResource();
  protected readonly rows = computed<Project[]>(() => (this.projects.hasValue() ? this.projects.value() : []));
  protected readonly canWrite = computed(() => this.auth.can('project:write'));

  protected openNewProject(): void {
    this.dialog
      .open<NewProjectDialog, undefined, Project>(NewProjectDialog, { autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((created) => {
        if (!created) return;
        this.snackBar.open(`Project “${created.name}” created`, 'Close', { duration: 4000 });
        this.projects.reload();
      });
  }
}
