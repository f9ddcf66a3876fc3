import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { InstrumentBody, InstrumentView } from '@shared/schemas/registers';
import { api } from '@/lib/api-client';
import { registerKeys } from './keys';

export const instrumentsQueryOptions = () =>
  queryOptions({
    queryKey: registerKeys.instruments,
    queryFn: () => api.get<{ instruments: InstrumentView[] }>('/api/instruments'),
  });

export const useInstruments = () => useQuery(instrumentsQueryOptions());

/** Adds an instrument, or saves one when an id and lockVersion are given. */
export function useSaveInstrument() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, lockVersion, ...body }: InstrumentBody & { id?: string; lockVersion?: number }) =>
      id
        ? api.put<{ instrument: InstrumentView }>(`/api/instruments/${id}`, { ...body, lockVersion })
        : api.post<{ instrument: InstrumentView }>('/api/instruments', body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: registerKeys.instruments }),
  });
}

export function useUploadCertificate() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, file }: { id: string; file: File }) =>
      api.upload<{ instrument: InstrumentView }>(
        `/api/instruments/${encodeURIComponent(id)}/certificate`,
        file,
      ),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: registerKeys.instruments }),
  });
}
