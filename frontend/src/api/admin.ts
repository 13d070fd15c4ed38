import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditEventWords } from '@shared/audit';
import { api } from './client';

/** One audit event: the stored codes (for filters) and the event in words (what the page shows). */
export interface AuditEventDto {
  id: number;
  at: string;
  action: string;
  entity: string;
  entityId: string | null;
  actor: { id: number; name: string; email: string } | null;
  words: AuditEventWords;
}
export interface AuditFilter {
  action?: string;
  actor?: string;
  entity?: string;
  from?: string;
  to?: string;
  page: number;
}
export interface MailSummaryDto {
  id: number;
  from: string;
  to: string[];
  subject: string;
  at: string;
  attachments: Array<{ filename: string; contentType: string; size: number }>;
}

export const adminKeys = {
  all: ['admin'] as const,
  audit: (f: AuditFilter) => [...adminKeys.all, 'audit', f] as const,
  mailList: (page: number) => [...adminKeys.all, 'mail', 'list', page] as const,
  mail: (id: number) => [...adminKeys.all, 'mail', 'detail', id] as const,
};

const qs = (o: Record<string, string | number | undefined>) =>
  new URLSearchParams(Object.entries(o).filter((e): e is [string, string | number] => e[1] !== undefined && e[1] !== '').map(([k, v]) => [k, String(v)])).toString();

export const auditQuery = (f: AuditFilter) =>
  queryOptions({
    queryKey: adminKeys.audit(f),
    queryFn: ({ signal }) => api<{ events: AuditEventDto[]; page: number; pageSize: number; total: number }>(`/admin/audit?${qs({ ...f })}`, { signal }),
    placeholderData: keepPreviousData,
  });

export function useAudit(f: AuditFilter) {
  return useQuery(auditQuery(f));
}

export function useMailOutbox(page: number) {
  return useQuery({
    queryKey: adminKeys.mailList(page),
    queryFn: ({ signal }) => api<{ messages: MailSummaryDto[]; page: number; pageSize: number; total: number }>(`/admin/mail?page=${page}`, { signal }),
    placeholderData: keepPreviousData,
  });
}

export function useMailMessage(id: number | null) {
  return useQuery({
    queryKey: adminKeys.mail(id ?? 0),
    queryFn: ({ signal }) => api<{ message: MailSummaryDto & { text: string } }>(`/admin/mail/${id}`, { signal }).then((r) => r.message),
    enabled: id !== null,
  });
}

export const mailAttachmentUrl = (id: number, n: number) => `/api/admin/mail/${id}/attachments/${n}`;
