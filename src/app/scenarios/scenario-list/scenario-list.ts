import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatChipsModule } from '@angular/material/chips';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { COMPARE_MAX, COMPARE_MIN, SCENARIO_NAME_MAX, type Scenario } from '@shared/scenarios/scenario-schemas';
import { formatMoneyWhole } from '@shared/money/money';
import { designPointText } from '@shared/sweep/tradeoff-summary';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage } from '../../core/api-errors';
import { ConfirmDialog, type ConfirmDialogData } from '../../ui/confirm-dialog/confirm-dialog';
import { NameDialog, type NameDialogData } from '../../ui/name-dialog/name-dialog';
import { ScenariosApi } from '../scenarios-api';

/** The project page's scenarios: open one's trade-off, add, copy, freeze for a bid, delete, and pick some to compare. */
@Component({
  selector: 'app-scenario-list',
  imports: [
    DatePipe,
    RouterLink,
    MatButtonModule,
    MatCheckboxModule,
    MatChipsModule,
    MatIconModule,
    MatMenuModule,
    MatProgressBarModule,
  ],
  templateUrl: './scenario-list.html',
  styleUrl: './scenario-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScenarioList {
  readonly projectId = input.required<string>();
  readonly canWrite = input.required<boolean>();

  private readonly api = inject(ScenariosApi);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  private readonly router = inject(Router);
  private readonly auth = inject(AuthStore);

  protected readonly scenarios = signal<Scenario[] | null>(null);
  protected readonly loadError = signal('');
  protected readonly selected = signal<ReadonlySet<string>>(new Set());
  protected readonly busy = signal(false);
  protected readonly compareMin = COMPARE_MIN;
  protected readonly compareMax = COMPARE_MAX;
  /** "Chosen: −17 °C (99 % design temperature) · Furnace 12 kW · $4,290" when the scenario's sweep is at hand. */
  protected chosenText(s: Scenario): string {
    const c = s.chosenPoint;
    if (!c) return '';
    const price = c.installedPrice === null ? '' : ` · ${formatMoneyWhole(c.installedPrice, c.currency)}`;
    return `${s.chosenDesignC === null ? 'Default point' : 'Chosen'}: ${designPointText(c, this.auth.unitSystem())} · ${c.unit ?? 'no unit large enough'}${price}`;
  }
  protected readonly canCompare = computed(
    () => this.selected().size >= COMPARE_MIN && this.selected().size <= COMPARE_MAX,
  );

  constructor() {
    effect(() => {
      void this.load(this.projectId());
    });
  }

  protected async load(projectId = this.projectId()): Promise<void> {
    this.loadError.set('');
    try {
      this.scenarios.set(await this.api.list(projectId));
    } catch (err) {
      this.loadError.set(apiErrorMessage(err, 'The scenarios could not be loaded.'));
    }
  }

  protected toggle(id: string, on: boolean): void {
    const next = new Set(this.selected());
    if (on) next.add(id);
    else next.delete(id);
    this.selected.set(next);
  }

  protected compare(): void {
    void this.router.navigate(['/projects', this.projectId(), 'compare'], {
      queryParams: { ids: [...this.selected()].join(',') },
    });
  }

  protected async create(): Promise<void> {
    const created = await this.askName({
      title: 'New scenario',
      label: 'Scenario name',
      initial: 'Base bid',
      submitLabel: 'Create',
      hint: 'It starts with the project’s climate site and equipment list; change them on its trade-off page.',
      choice: {
        legend: 'Equipment family to consider',
        initial: 'heat-pump',
        testId: 'new-scenario-family',
        options: [
          { value: 'fuel-fired', label: 'Fuel-fired (furnaces, boilers)' },
          { value: 'heat-pump', label: 'Heat pumps (with backup heat)' },
          { value: 'electric', label: 'Electric resistance' },
          { value: 'mixed', label: 'Mixed families: the lowest life-cycle cost decides' },
        ],
      },
      save: (name, family) =>
        this.api.create(this.projectId(), {
          name,
          settings: {
            equipmentFamily: family === 'fuel-fired' || family === 'heat-pump' || family === 'electric' ? family : null,
          },
        }),
    });
    if (created) await this.router.navigate(['/projects', this.projectId(), 'scenarios', created.id]);
  }

  protected async rename(s: Scenario): Promise<void> {
    const saved = await this.askName({
      title: 'Rename scenario',
      label: 'Scenario name',
      initial: s.name,
      submitLabel: 'Rename',
      save: (name, _choice, current) =>
        this.api.update(this.projectId(), s.id, { version: (current ?? s).version, name }),
      versioned: { record: s, load: (latest) => this.api.get(latest.projectId, latest.id) },
    });
    if (saved) await this.load();
  }

  protected async duplicate(s: Scenario): Promise<void> {
    await this.act(async () => {
      const copy = await this.api.duplicate(this.projectId(), s.id);
      this.snack.open(`Copied as “${copy.name}”`, undefined, { duration: 4000 });
    });
  }

  protected async freeze(s: Scenario): Promise<void> {
    const frozen = await this.askName({
      title: 'Freeze for a bid',
      label: 'Name of the frozen copy',
      initial: `${s.name} · bid ${new Date().toISOString().slice(0, 10)}`,
      submitLabel: 'Freeze',
      hint: 'A dated copy keeps today’s inputs, prices and results. It can be read, compared and copied, but never changed.',
      save: (name) => this.api.freeze(this.projectId(), s.id, name),
    });
    if (frozen) {
      this.snack.open(`Frozen as “${frozen.name}”`, undefined, { duration: 4000 });
      await this.router.navigate(['/projects', this.projectId(), 'scenarios', frozen.id]);
    }
  }

  protected async remove(s: Scenario): Promise<void> {
    const data: ConfirmDialogData = {
      title: 'Delete scenario?',
      message: s.frozenAt
        ? `“${s.name}” is a frozen bid copy. Deleting it removes the record of what was bid.`
        : `“${s.name}” and its settings will be deleted.`,
      confirmLabel: 'Delete',
    };
    const ok = await firstValueFrom(
      this.dialog.open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data }).afterClosed(),
    );
    if (!ok) return;
    await this.act(async () => {
      await this.api.remove(this.projectId(), s.id);
      this.toggle(s.id, false);
    });
  }

  private async askName<T, R = unknown>(data: Omit<NameDialogData<T, R>, 'maxLength'>): Promise<T | undefined> {
    const ref = this.dialog.open<NameDialog<T, R>, NameDialogData<T, R>, T>(NameDialog, {
      data: { ...data, maxLength: SCENARIO_NAME_MAX },
    });
    return firstValueFrom(ref.afterClosed());
  }

  private async act(action: () => Promise<void>): Promise<void> {
    this.busy.set(true);
    try {
      await action();
      await this.load();
    } catch (err) {
      this.snack.open(apiErrorMessage(err), 'Dismiss', { duration: 8000 });
    } finally {
      this.busy.set(false);
    }
  }
}
