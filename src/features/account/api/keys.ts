export const accountKeys = {
  all: ['account'] as const,
};
