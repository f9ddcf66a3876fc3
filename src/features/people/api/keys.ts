export const peopleKeys = {
  all: ['people'] as const,
  list: () => [...peopleKeys.all, 'list'] as const,
  signInSettings: () => [...peopleKeys.all, 'sign-in-settings'] as const,
};
