/** Query keys for mail: a project's summary, the person's preferences, the mail fake's inbox. */
export const mailKeys = {
  all: ['mail'] as const,
  summary: (projectId: number) => [...mailKeys.all, 'summary', projectId] as const,
  summarySettings: (projectId: number) => [...mailKeys.summary(projectId), 'settings'] as const,
  summaryPreview: (projectId: number) => [...mailKeys.summary(projectId), 'preview'] as const,
  preferences: () => [...mailKeys.all, 'preferences'] as const,
  caught: () => [...mailKeys.all, 'caught'] as const,
  caughtMessage: (id: number) => [...mailKeys.caught(), id] as const,
};
