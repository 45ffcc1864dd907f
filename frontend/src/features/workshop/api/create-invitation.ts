import { mutate } from 'swr';
import type { CreateInvitationRequest, InvitationView } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { teamKey } from './get-team';

/** `POST /api/workshop/team/invitations` (owner) → 201; the server e-mails the link to join. */
export async function createInvitation(body: CreateInvitationRequest): Promise<InvitationView> {
  const invitation = await api<InvitationView>(`${teamKey}/invitations`, {
    method: 'POST',
    body: { ...body },
  });
  await mutate(teamKey);
  return invitation;
}
