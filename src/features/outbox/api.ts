import { useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api';

export interface OutboxAttachment {
  index: number;
  filename: string;
  contentType: string;
  size: number;
}

export interface OutboxMessage {
  id: string;
  to: string;
  from: string;
  subject: string;
  date: string;
  text: string;
  html: string;
  attachments: OutboxAttachment[];
}

export function useOutbox(enabled: boolean) {
  return useQuery({
    queryKey: ['outbox'],
    queryFn: ({ signal }) => api.get<{ messages: OutboxMessage[] }>('/api/outbox', signal),
    enabled,
    refetchInterval: 10_000,
  });
}

export function attachmentUrl(messageId: string, index: number): string {
  return `/api/outbox/${encodeURIComponent(messageId)}/attachments/${index}`;
}
