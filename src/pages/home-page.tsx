import { DraftingSketch } from '../components/drafting-sketch';
import { ServiceStatusCard } from '../features/health/components/service-status-card';
import { Inbox } from '../features/inbox/components/inbox';
import { roleCan } from '../../shared/schemas/roles';
import { useCurrentTeam } from '../app/use-current-team';

/** Signed in: what waits for the person (their inbox). Signed out: the product and the service status. */
export function HomePage() {
  const { me, teams, setTeamId } = useCurrentTeam();
  if (me.data) {
    return (
      <div className="grid max-w-3xl gap-6">
        <title>Tangentry — what waits for you</title>
        <h1 className="text-3xl font-semibold tracking-tight">What waits for you, {me.data.user.name}</h1>
        <Inbox canReview={teams.some((t) => roleCan(t.role, 'versions.review'))} onOpenTeam={setTeamId} />
      </div>
    );
  }
  return (
    <div className="grid gap-10 lg:grid-cols-[minmax(0,1fr)_minmax(0,36rem)] lg:items-start">
      <title>Tangentry</title>
      <section aria-labelledby="home-heading" className="max-w-prose">
        <h1 id="home-heading" className="text-3xl font-semibold tracking-tight sm:text-4xl">
          The shared curve library for game studios
        </h1>
        <p className="mt-4 text-lg leading-relaxed text-ink/85 dark:text-paper/85">
          Animators shape curves here; Tangentry bakes each one for every target platform into the
          smallest runtime table that stays within that platform's error budget, proves the bound, and
          hands the approved version to your build servers.
        </p>
        <figure className="mt-8 max-w-lg rounded-md border border-grid-major/70 bg-card/80 p-4 dark:border-night-line dark:bg-night-card/80">
          <DraftingSketch className="h-auto w-full" />
          <figcaption className="mt-3 border-t border-grid-minor pt-2 text-sm text-ink/65 dark:border-night-line dark:text-paper/65">
            A curve with its keys and slope handles, the entries of a baked table, and the band its
            error must stay within.
          </figcaption>
        </figure>
      </section>
      <ServiceStatusCard />
    </div>
  );
}
