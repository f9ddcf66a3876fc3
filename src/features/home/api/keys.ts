export const homeKeys = { all: ['home'] as const };
