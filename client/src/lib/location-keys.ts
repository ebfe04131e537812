/** Query keys of test locations. */
export const locationKeys = {
  all: ['locations'] as const,
  byProject: (projectId: number) => [...locationKeys.all, 'by-project', projectId] as const,
  detail: (id: number) => [...locationKeys.all, 'detail', id] as const,
};
