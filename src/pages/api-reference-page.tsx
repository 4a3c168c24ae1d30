import { Link } from 'react-router-dom';
import { Card } from '../components/card';
import { FormAlert } from '../components/form-controls';
import { formMessage } from '../lib/form-errors';
import { useOpenApiDocument } from '../features/api-reference/api/openapi-document';
import { useTeamPacksV1 } from '../features/api-reference/api/team-packs';
import { endpointsOf, type ExampleValues } from '../features/api-reference/endpoints';
import { EndpointCard } from '../features/api-reference/components/endpoint-card';
import { CodeBlock } from '../features/api-reference/components/code-block';
import { ProblemCodes } from '../features/api-reference/components/problem-codes';
import { roleCan } from '../../shared/schemas/roles';
import { RequireSignIn } from './require-sign-in';
import { TeamNav } from './team-nav';

const GROUPS: { tag: string; title: string }[] = [
  { tag: 'meta', title: 'The document, and who you are' },
  { tag: 'packs', title: 'Packs, channels and manifests' },
  { tag: 'downloads', title: 'Downloads' },
];

/** The build-server API reference, read from the served OpenAPI document, with curl commands for this team. */
export function ApiReferencePage() {
  return (
    <RequireSignIn>
      {({ team }) =>
        !team ? (
          <p>You are not in any team yet. An admin can invite you.</p>
        ) : (
          <div>
            <title>{`Build-server API · ${team.name} · Tangentry`}</title>
            <h1 className="text-2xl font-semibold tracking-tight">{team.name}: build-server API</h1>
            <p className="mt-2 max-w-prose text-sm">
              Build servers and engine tools read packs, channels and manifests and download baked tables under <code className="font-mono">/api/v1</code>, with a read-only service token.
            </p>
            <TeamNav role={team.role} />
            <Reference teamId={team.id} teamName={team.name} canManageTokens={roleCan(team.role, 'tokens.manage')} />
          </div>
        )
      }
    </RequireSignIn>
  );
}

function Reference({ teamId, teamName, canManageTokens }: { teamId: string; teamName: string; canManageTokens: boolean }) {
  const doc = useOpenApiDocument();
  const packs = useTeamPacksV1(teamId);
  const origin = window.location.origin;
  const withChannel = packs.data?.find((p) => p.channels.length > 0);
  const anyPack = withChannel ?? packs.data?.find((p) => p.latestVersion !== null) ?? packs.data?.[0];
  const examples: ExampleValues = {
    origin, teamId, pack: anyPack?.slug, channel: withChannel?.channels[0]?.name,
    version: withChannel?.channels[0]?.version ?? anyPack?.latestVersion ?? undefined,
  };
  const endpoints = doc.data ? endpointsOf(doc.data) : [];

  return (
    <div className="mt-6 space-y-8">
      <Card className="p-5">
        <h2 className="text-lg font-semibold">Before you start</h2>
        <ol className="mt-2 list-decimal space-y-2 pl-5 text-sm">
          <li>
            {canManageTokens ? (
              <>Create a token on the <Link to="/team/tokens" className="underline">Service tokens</Link> page (limit it to the packs the build needs).</>
            ) : (
              <>Ask an admin of {teamName} for a service token; they make them on the <Link to="/team/tokens" className="underline">Service tokens</Link> page.</>
            )}
          </li>
          <li>
            Keep it in the build’s secret store and expose it as <code className="font-mono">TANGENTRY_TOKEN</code>:
            <div className="mt-2"><CodeBlock code={'export TANGENTRY_TOKEN=tgt_…'} label="Set the token" /></div>
          </li>
          <li>
            Your team id is <code data-testid="team-id" className="font-mono">{teamId}</code>; the commands below already use it
            {anyPack ? <> and the pack <code className="font-mono">{anyPack.slug}</code></> : null}.
          </li>
        </ol>
        <p className="mt-3 text-sm">
          The whole contract is the <a href="/api/v1/openapi.json" className="underline">OpenAPI 3.1 document</a>; this page is read from it.
        </p>
      </Card>

      {doc.isPending ? <p className="text-sm">Loading the API document…</p> : null}
      {doc.isError ? <FormAlert message={formMessage(doc.error)} /> : null}
      {GROUPS.map((g) => {
        const list = endpoints.filter((e) => e.tag === g.tag);
        if (!list.length) return null;
        return (
          <section key={g.tag} aria-labelledby={`group-${g.tag}`}>
            <h2 id={`group-${g.tag}`} className="text-lg font-semibold">{g.title}</h2>
            <div className="mt-3 space-y-4">
              {list.map((e) => <EndpointCard key={e.id} endpoint={e} examples={examples} />)}
            </div>
          </section>
        );
      })}

      <section aria-labelledby="caching">
        <h2 id="caching" className="text-lg font-semibold">Caching</h2>
        <div className="mt-2 max-w-prose space-y-2 text-sm">
          <p>
            Artifacts and sources never change: their ETag is <code className="font-mono">"&lt;sha256&gt;"</code> and they are cached for a year
            (<code className="font-mono">immutable</code>). Send <code className="font-mono">If-None-Match</code> with the checksum you have and you get 304 with no body.
          </p>
          <p>
            Channels and manifests move: they answer <code className="font-mono">no-cache</code> with an ETag, so revalidate each build; 304 means nothing changed.
          </p>
          <p>Check every download against the manifest’s SHA-256 (the <code className="font-mono">X-Content-SHA256</code> header carries it too).</p>
        </div>
      </section>

      <section aria-labelledby="problems">
        <h2 id="problems" className="text-lg font-semibold">Errors</h2>
        <p className="mt-2 max-w-prose text-sm">
          Every error is an RFC 9457 problem detail (<code className="font-mono">application/problem+json</code>) with <code className="font-mono">type</code>,{' '}
          <code className="font-mono">title</code>, <code className="font-mono">status</code>, <code className="font-mono">detail</code> and a stable{' '}
          <code className="font-mono">code</code>. A 429 carries <code className="font-mono">Retry-After</code>.
        </p>
        <Card className="mt-3 p-4">
          <ProblemCodes />
        </Card>
      </section>
    </div>
  );
}
