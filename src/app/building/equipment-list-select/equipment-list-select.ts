import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  output,
  signal,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RouterLink } from '@angular/router';
import type { Project } from '@shared/projects/project-schemas';
import { VersionedEdit } from '../../core/versioned-edit';
import { ProjectsApi, type EquipmentListChoice } from '../../projects/projects-api';

/** The equipment list a project compares its heat loss with: chosen here, saved on the project. */
@Component({
  selector: 'app-equipment-list-select',
  imports: [RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatSelectModule],
  template: `
    <section class="equipment" aria-labelledby="equipment-title" data-testid="equipment-list-select">
      <h2 id="equipment-title">Equipment</h2>
      <p class="lede">
        The heating units you could install for this project, with their output in the cold and their installed prices,
        come from one of your organisation's equipment lists.
      </p>
      @if (edit.error()) {
        <div class="tr-alert" role="alert">
          <mat-icon aria-hidden="true">error</mat-icon>
          <span class="alert-text">{{ edit.error() }}</span>
          @if (edit.isStale()) {
            <button mat-stroked-button type="button" [disabled]="edit.isPending()" (click)="reload()">Reload</button>
          }
        </div>
      }
      <div class="row">
        <mat-form-field class="select">
          <mat-label>Equipment list</mat-label>
          <mat-select
            [value]="selected()"
            (selectionChange)="choose($event.value)"
            [disabled]="!canWrite() || edit.isPending()"
          >
            <mat-option [value]="null">None chosen</mat-option>
            @for (l of choices(); track l.id) {
              <mat-option [value]="l.id"
                >{{ l.name }} ({{ l.optionCount }} {{ l.optionCount === 1 ? 'option' : 'options' }})</mat-option
              >
            }
          </mat-select>
          <mat-hint>Its heat pumps, furnaces and boilers are drawn beside the heat loss below</mat-hint>
        </mat-form-field>
        @if (project().equipmentListId; as listId) {
          <a mat-button [routerLink]="['/equipment-lists', listId]" data-testid="equipment-list-link">
            <mat-icon aria-hidden="true">open_in_new</mat-icon>Open the list
          </a>
        }
      </div>
      @if (lists.hasValue() && lists.value().length === 0) {
        <p class="lede">
          Your organisation has no equipment lists yet.
          <a routerLink="/equipment-lists">Make one on the Equipment page</a>.
        </p>
      }
    </section>
  `,
  styles: `
    h2 {
      font: var(--mat-sys-title-large);
      font-weight: 600;
      margin: 2rem 0 0.5rem;
    }

    .lede {
      color: var(--mat-sys-on-surface-variant);
      max-width: 75ch;
      margin: 0 0 0.75rem;
    }

    .row {
      display: flex;
      flex-wrap: wrap;
      align-items: flex-start;
      gap: 0.5rem 1rem;
    }

    .select {
      flex: 0 1 28rem;
      min-width: 0;
      width: 100%;
    }

    .tr-alert {
      align-items: center;
      flex-wrap: wrap;
    }

    .alert-text {
      flex: 1 1 16rem;
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EquipmentListSelect {
  // services
  private readonly api = inject(ProjectsApi);
  private readonly snackBar = inject(MatSnackBar);

  readonly project = input.required<Project>();
  readonly canWrite = input(false);
  /** The project as saved with its new list (or as reloaded). */
  readonly changed = output<Project>();

  protected readonly lists = this.api.equipmentListChoicesResource();
  protected readonly choices = computed<EquipmentListChoice[]>(() => {
    const lists = this.lists.hasValue() ? [...this.lists.value()] : [];
    const p = this.project();
    if (p.equipmentListId && !lists.some((l) => l.id === p.equipmentListId)) {
      lists.unshift({ id: p.equipmentListId, name: p.equipmentListName ?? 'Chosen equipment list', optionCount: 0 });
    }
    return lists;
  });

  protected readonly selected = signal<string | null>(null);
  /** Saves the choice over the project's version; after someone else saved, Reload takes theirs. */
  protected readonly edit = new VersionedEdit<Project>({
    record: linkedSignal(() => this.project()),
    load: (p) => this.api.get(p.id),
  });

  constructor() {
    effect(() => this.selected.set(this.project().equipmentListId));
  }

  protected async choose(listId: string | null): Promise<void> {
    const project = this.project();
    if (!this.canWrite() || this.edit.isPending() || listId === project.equipmentListId) return;
    this.selected.set(listId);
    const saved = await this.edit.save((p) => this.api.update(p.id, { version: p.version, equipmentListId: listId }));
    if (!saved) {
      this.selected.set(project.equipmentListId);
      return;
    }
    this.changed.emit(saved);
    this.snackBar.open(listId ? 'Equipment list chosen' : 'Equipment list removed', 'Close', { duration: 4000 });
  }

  protected async reload(): Promise<void> {
    const latest = await this.edit.reload();
    if (latest) this.changed.emit(latest);
  }
}
