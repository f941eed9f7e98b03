import { useQuery } from '@tanstack/react-query';
import { http } from '../../lib/http';
import { caughtMailListSchema } from './types';

export const mailKeys = {
  all: ['admin', 'mail'] as const,
  list: () => [...mailKeys.all, 'list'] as const,
};

/** What the local SMTP fake caught (site admins); refreshed every few seconds while open. */
export function useCaughtMail() {
  return useQuery({
    queryKey: mailKeys.list(),
    queryFn: ({ signal }) => http('/api/admin/mail', { schema: caughtMailListSchema, signal }),
    refetchInterval: 5_000,
    staleTime: 0,
  });
}
