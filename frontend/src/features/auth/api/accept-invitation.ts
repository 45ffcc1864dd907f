import { mutate } from 'swr';
import { api } from '@/lib/api-client';
import type { AcceptInvitationRequest, RegisterResponse } from '@loamline/shared-types';
import { meKey } from './get-me';

/** `POST /api/invitations/accept`: creates the staff account and signs it in (201). */
export async function acceptInvitation(body: AcceptInvitationRequest): Promise<void> {
  const { user } = await api<RegisterResponse>('/invitations/accept', { method: 'POST', body: { ...body } });
  await mutate(meKey, user, { revalidate: false });
}
