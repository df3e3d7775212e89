import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { MatDividerModule } from '@angular/material/divider';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import type { UnitSystem } from '@shared/units/units';
import { roleLabels, type Role } from '@shared/auth/roles';
import { AuthStore } from './auth/auth-store';
import { apiErrorMessage } from './core/api-errors';
import { RouteFocus } from './core/route-focus';
import type { NameDialogData } from './ui/name-dialog/name-dialog';

/** The shell: toolbar with navigation, organisation, units and account; then the page. */
@Component({
  selector: 'app-root',
  imports: [
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    MatButtonModule,
    MatButtonToggleModule,
    MatDividerModule,
    MatIconModule,
    MatMenuModule,
    MatProgressBarModule,
    MatToolbarModule,
  ],
  templateUrl: './app.html',
  styleUrl: './app.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class App {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly router = inject(Router);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly routeFocus = inject(RouteFocus);

  protected readonly unitsPending = signal(false);
  protected readonly organizationName = computed(() => this.auth.currentOrganization()?.name ?? 'No organisation');

  constructor() {
    void this.auth.whenLoaded();
    this.routeFocus.start();
  }

  /** The skip link: straight to the page's content, without changing the address. */
  protected skipToMain(event: Event): void {
    event.preventDefault();
    this.routeFocus.focusMain();
  }

  protected roleLabel(role: Role): string {
    return roleLabels[role];
  }

  protected async switchOrganization(organizationId: string): Promise<void> {
    if (organizationId === this.auth.currentOrganizationId()) return;
    try {
      const session = await this.auth.switchOrganization(organizationId);
      const name = session.organizations.find((o) => o.id === organizationId)?.name ?? 'the organisation';
      this.snackBar.open(`Switched to ${name}`, 'Close', { duration: 3000 });
    } catch (err) {
      this.snackBar.open(apiErrorMessage(err), 'Close', { duration: 6000 });
    }
  }

  protected async openNewOrganization(): Promise<void> {
    // Loaded on demand: the dialog brings the form code with it.
    const [{ NameDialog }, { ORGANIZATION_NAME_MAX_LENGTH }] = await Promise.all([
      import('./ui/name-dialog/name-dialog'),
      import('@shared/auth/auth-schemas'),
    ]);
    const data: NameDialogData<boolean> = {
      title: 'New organisation',
      label: 'Organisation name',
      initial: '',
      submitLabel: 'Create organisation',
      maxLength: ORGANIZATION_NAME_MAX_LENGTH,
      hint: 'You will be its owner, and Tailroom switches to it.',
      autocomplete: 'organization',
      save: async (name) => {
        await this.auth.createOrganization(name);
        return true;
      },
    };
    this.dialog
      .open<InstanceType<typeof NameDialog<boolean>>, NameDialogData<boolean>, boolean>(NameDialog, { data })
      .afterClosed()
      .subscribe((created) => {
        if (!created) return;
        this.snackBar.open(`Switched to ${this.organizationName()}`, 'Close', { duration: 3000 });
        void this.router.navigateByUrl('/projects');
      });
  }

  protected async setUnits(unitSystem: UnitSystem): Promise<void> {
    if (unitSystem === this.auth.unitSystem() || this.unitsPending()) return;
    this.unitsPending.set(true);
    try {
      await this.auth.setUnitSystem(unitSystem);
    } catch (err) {
      this.snackBar.open(apiErrorMessage(err), 'Close', { duration: 6000 });
    } finally {
      this.unitsPending.set(false);
    }
  }

  protected async signOutEverywhere(): Promise<void> {
    try {
      await this.auth.signOutEverywhere();
    } catch {
      // The local session is cleared either way.
    }
    await this.router.navigateByUrl('/sign-in');
  }

  protected async signOut(): Promise<void> {
    try {
      await this.auth.signOut();
    } catch {
      // The local session is cleared either way.
    }
    await this.router.navigateByUrl('/sign-in');
  }
}
