import { HttpClient, httpResource } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { firstValueFrom } from 'rxjs';
import type { Role } from '@shared/auth/roles';
import {
  invitationListSchema,
  invitationSchema,
  memberListSchema,
  memberSchema,
  type Invitation,
  type InvitationInput,
  type Member,
} from '@shared/orgs/org-schemas';
import { AuthStore } from '../auth/auth-store';

/** Members and invitations of the current organisation. */
@Injectable({ providedIn: 'root' })
export class TeamApi {
  private readonly http = inject(HttpClient);
  private readonly auth = inject(AuthStore);

  membersResource() {
    return httpResource(() => (this.auth.currentOrganizationId() ? '/api/v1/members' : undefined), {
      parse: memberListSchema.parse,
    });
  }

  /** Loads only for those who may manage members. */
  invitationsResource() {
    return httpResource(
      () => (this.auth.currentOrganizationId() && this.auth.can('member:manage') ? '/api/v1/invitations' : undefined),
      { parse: invitationListSchema.parse },
    );
  }

  async changeRole(userId: string, role: Role): Promise<Member> {
    const body = await firstValueFrom(this.http.patch<unknown>(`/api/v1/members/${userId}`, { role }));
    return memberSchema.parse(body);
  }

  async removeMember(userId: string): Promise<void> {
    await firstValueFrom(this.http.delete(`/api/v1/members/${userId}`));
  }

  async invite(input: InvitationInput): Promise<Invitation> {
    return invitationSchema.parse(await firstValueFrom(this.http.post<unknown>('/api/v1/invitations', input)));
  }

  async revoke(invitationId: string): Promise<void> {
    await firstValueFrom(this.http.delete(`/api/v1/invitations/${invitationId}`));
  }
}
