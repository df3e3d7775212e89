import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal, viewChild } from '@angular/core';
import { FormGroupDirective, NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { firstValueFrom } from 'rxjs';
import { roleLabels, roles, type Role } from '@shared/auth/roles';
import type { Invitation, Member } from '@shared/orgs/org-schemas';
import { AuthStore } from '../../auth/auth-store';
import { apiErrorMessage, applyApiErrors, fieldError } from '../../core/api-errors';
import { emailAddress } from '../../core/validators';
import { ConfirmDialog, type ConfirmDialogData } from '../../ui/confirm-dialog/confirm-dialog';
import { TeamApi } from '../team-api';
import { AuditLog } from '../audit-log/audit-log';
import { FirmLogo } from '../firm-logo/firm-logo';

@Component({
  selector: 'app-team-page',
  imports: [
    AuditLog,
    FirmLogo,
    DatePipe,
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
  ],
  templateUrl: './team-page.html',
  styleUrl: './team-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class TeamPage {
  // services
  protected readonly auth = inject(AuthStore);
  private readonly api = inject(TeamApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);

  protected readonly roles = roles;
  protected readonly roleLabels = roleLabels;
  protected readonly fieldError = fieldError;

  // queries
  private readonly auditLog = viewChild(AuditLog);

  protected readonly members = this.api.membersResource();
  protected readonly invitations = this.api.invitationsResource();
  protected readonly canManage = computed(() => this.auth.can('member:manage'));
  protected readonly memberRows = computed<Member[]>(() => (this.members.hasValue() ? this.members.value() : []));
  protected readonly invitationRows = computed<Invitation[]>(() =>
    this.invitations.hasValue() ? this.invitations.value() : [],
  );
  protected readonly memberColumns = computed(() =>
    this.canManage() ? ['name', 'email', 'role', 'joinedAt', 'actions'] : ['name', 'email', 'role', 'joinedAt'],
  );
  protected readonly invitationColumns = ['email', 'role', 'status', 'expiresAt', 'actions'];

  /** Member ids with a change in flight. */
  protected readonly busy = signal<ReadonlySet<string>>(new Set());
  protected readonly teamError = signal('');

  protected readonly inviteForm = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, emailAddress]],
    role: ['designer' as Role, [Validators.required]],
  });
  protected readonly invitePending = signal(false);
  protected readonly inviteError = signal('');

  protected async changeRole(member: Member, role: Role): Promise<void> {
    if (role === member.role) return;
    await this.withBusy(member.userId, async () => {
      await this.api.changeRole(member.userId, role);
      this.snackBar.open(`${member.name} is now ${roleLabels[role].toLowerCase()}`, 'Close', { duration: 4000 });
      if (member.userId === this.auth.user()?.id) await this.auth.refresh();
    });
    // Reload in every case so a refused change puts the select back.
    this.members.reload();
    this.auditLog()?.reload();
  }

  protected async removeMember(member: Member): Promise<void> {
    const organization = this.auth.currentOrganization()?.name ?? 'this organisation';
    const data: ConfirmDialogData = {
      title: `Remove ${member.name}?`,
      message: `${member.name} (${member.email}) will lose access to ${organization} and its projects.`,
      confirmLabel: 'Remove',
    };
    const confirmed = await firstValueFrom(
      this.dialog.open<ConfirmDialog, ConfirmDialogData, boolean>(ConfirmDialog, { data }).afterClosed(),
    );
    if (!confirmed) return;
    await this.withBusy(member.userId, async () => {
      await this.api.removeMember(member.userId);
      this.snackBar.open(`${member.name} was removed`, 'Close', { duration: 4000 });
      if (member.userId === this.auth.user()?.id) await this.auth.refresh();
    });
    this.members.reload();
    this.auditLog()?.reload();
  }

  protected async sendInvitation(formDirective: FormGroupDirective): Promise<void> {
    if (this.invitePending()) return;
    if (this.inviteForm.invalid) {
      this.inviteForm.markAllAsTouched();
      return;
    }
    const { email, role } = this.inviteForm.getRawValue();
    this.invitePending.set(true);
    this.inviteError.set('');
    try {
      const invitation = await this.api.invite({ email: email.trim(), role });
      this.snackBar.open(`Invitation sent to ${invitation.email}`, 'Close', { duration: 4000 });
      formDirective.resetForm({ email: '', role: 'designer' });
      this.invitations.reload();
      this.auditLog()?.reload();
    } catch (err) {
      this.inviteError.set(applyApiErrors(this.inviteForm, err));
    } finally {
      this.invitePending.set(false);
    }
  }

  protected async revoke(invitation: Invitation): Promise<void> {
    await this.withBusy(invitation.id, async () => {
      await this.api.revoke(invitation.id);
      this.snackBar.open(`Invitation for ${invitation.email} revoked`, 'Close', { duration: 4000 });
    });
    this.invitations.reload();
    this.auditLog()?.reload();
  }

  protected roleLabel(role: Role): string {
    return roleLabels[role];
  }

  protected isBusy(id: string): boolean {
    return this.busy().has(id);
  }

  private async withBusy(id: string, action: () => Promise<void>): Promise<void> {
    this.busy.update((s) => new Set(s).add(id));
    this.teamError.set('');
    try {
      await action();
    } catch (err) {
      const message = apiErrorMessage(err);
      this.teamError.set(message);
      this.snackBar.open(message, 'Close', { duration: 6000 });
    } finally {
      this.busy.update((s) => {
        const next = new Set(s);
        next.delete(id);
        return next;
      });
    }
  }
}
