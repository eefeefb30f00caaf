export const policyKeys = {
  all: ['policy'] as const,
  current: () => [...policyKeys.all, 'current'] as const,
  versions: () => [...policyKeys.all, 'versions'] as const,
};
