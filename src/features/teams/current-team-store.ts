/**
 * The current team lives in a small zustand store persisted to localStorage (key
 * `tangentry.current-team`), not in the URL: every page works on "the team chosen in the top bar",
 * and links stay short. When the stored team is not among the person's teams (removed, another
 * person on this browser) the first team is used. Choose with the team switcher in the top bar.
 */
import { create } from 'zustand';
import { persist } from 'zustand/middleware';

interface CurrentTeamState {
  teamId: string | null;
  setTeamId: (id: string) => void;
}

export const useCurrentTeamStore = create<CurrentTeamState>()(
  persist((set) => ({ teamId: null, setTeamId: (teamId) => set({ teamId }) }), { name: 'tangentry.current-team' }),
);

/** The current team among `teams` (by id), falling back to the first. */
export function pickCurrentTeam<T extends { id: string }>(teams: readonly T[], storedId: string | null): T | null {
  return teams.find((t) => t.id === storedId) ?? teams[0] ?? null;
}
