/** ['counts'] refreshes every list and count; ['counts', 'detail', id] one count. */
export const countKeys = {
  all: ['counts'] as const,
  lists: () => ['counts', 'list'] as const,
  details: () => ['counts', 'detail'] as const,
  detail: (id: number) => ['counts', 'detail', id] as const,
  /** What a new count can be made from: the procedures and one procedure's revisions, as the form lists them. */
  procedures: () => ['counts', 'procedures'] as const,
  procedure: (id: number) => ['counts', 'procedures', id] as const,
};
