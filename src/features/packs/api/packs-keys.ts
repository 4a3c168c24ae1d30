/** Query keys of the library: one list of packs per team, one entry per pack (its curves). */
export const packsQueryKey = (teamId: string) => ['teams', teamId, 'packs'] as const;
export const packQueryKey = (teamId: string, slug: string) => ['teams', teamId, 'packs', slug] as const;
