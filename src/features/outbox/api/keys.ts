export const outboxKeys = {
  all: ['outbox'] as const,
  list: (status: string, page: number) => [...outboxKeys.all, 'list', { status, page }] as const,
};
