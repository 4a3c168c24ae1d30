import { useMe, type MyTeam } from '../features/auth/api/get-me';
import { pickCurrentTeam, useCurrentTeamStore } from '../features/teams/current-team-store';

/** The signed-in person, their teams and the current one (see features/teams/current-team-store.ts). */
export function useCurrentTeam() {
  const me = useMe();
  const storedId = useCurrentTeamStore((s) => s.teamId);
  const setTeamId = useCurrentTeamStore((s) => s.setTeamId);
  const teams: MyTeam[] = me.data?.teams ?? [];
  return { me, teams, team: pickCurrentTeam(teams, storedId), setTeamId };
}
