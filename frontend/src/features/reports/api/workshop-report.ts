import useSWR, { mutate } from 'swr';
import type { Attachment, ServiceReport, ServiceReportInput } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import type { FitResult, Part } from '../types';

/*
 * The Workshop side of the service report (issue 11). Every route of it is in this file, so a route
 * that lands differently is changed here only.
 */

const base = (id: string) => `/workshop/appointments/${encodeURIComponent(id)}`;
export const workshopReportKey = (id: string) => `${base(id)}/report`;

/** `GET /api/workshop/appointments/:id/report`: the draft (or final) report with its attachments and fits. */
export function useWorkshopReport(id: string | undefined) {
  return useSWR<ServiceReport, Error>(id ? workshopReportKey(id) : null, (key: string) =>
    api<ServiceReport>(key),
  );
}

export const reloadWorkshopReport = (id: string) => mutate(workshopReportKey(id));

/** `PUT …/report`: 409 when another save won meanwhile, or once the report is final. */
export async function saveReport(id: string, input: ServiceReportInput): Promise<ServiceReport> {
  const saved = await api<ServiceReport>(workshopReportKey(id), {
    method: 'PUT',
    body: input as unknown as Record<string, unknown>,
  });
  await mutate(workshopReportKey(id), saved, { revalidate: false });
  return saved;
}

/** What a curve was run at, sent with its CSV. Pressures psi, as on the wire. */
export interface CurveUpload {
  label: string;
  part: Part;
  mainPsi: number;
  endStrokePsi: number | null;
  spacers: number;
}

/** `POST …/attachments` (multipart): a photo, or a curve with the settings it was run at. */
export async function uploadAttachment(id: string, file: File, curve?: CurveUpload): Promise<Attachment> {
  const form = new FormData();
  form.append('kind', curve ? 'curve' : 'photo');
  if (curve) {
    form.append('label', curve.label);
    form.append('part', curve.part);
    form.append('mainPsi', String(curve.mainPsi));
    if (curve.endStrokePsi !== null) form.append('endStrokePsi', String(curve.endStrokePsi));
    form.append('spacers', String(curve.spacers));
  }
  form.append('file', file, file.name);
  const att = await api<Attachment>(`${base(id)}/attachments`, { method: 'POST', form });
  await reloadWorkshopReport(id);
  return att;
}

/** `DELETE …/attachments/:attId` */
export async function deleteAttachment(id: string, attId: string): Promise<void> {
  await api<void>(`${base(id)}/attachments/${encodeURIComponent(attId)}`, { method: 'DELETE' });
  await reloadWorkshopReport(id);
}

/** `POST …/fits`: fit the part's spring from its runs (all of them, or the ones named). */
export async function fitSpring(id: string, part: Part, attachmentIds?: string[]): Promise<FitResult> {
  const fit = await api<FitResult>(`${base(id)}/fits`, {
    method: 'POST',
    body: attachmentIds ? { part, attachmentIds } : { part },
  });
  await reloadWorkshopReport(id);
  return fit;
}

/** `POST …/fits/:fitId/store`: on the bike; a poor fit needs `confirmPoor`. */
export async function storeFit(id: string, fitId: string, confirmPoor: boolean): Promise<FitResult> {
  const fit = await api<FitResult>(`${base(id)}/fits/${encodeURIComponent(fitId)}/store`, {
    method: 'POST',
    body: confirmPoor ? { confirmPoor: true } : {},
  });
  await reloadWorkshopReport(id);
  return fit;
}

/** `POST …/fits/:fitId/reject` */
export async function rejectFit(id: string, fitId: string): Promise<FitResult> {
  const fit = await api<FitResult>(`${base(id)}/fits/${encodeURIComponent(fitId)}/reject`, {
    method: 'POST',
    body: {},
  });
  await reloadWorkshopReport(id);
  return fit;
}
