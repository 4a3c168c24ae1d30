import { Card } from '../../../components/card';
import { curlFor, type Endpoint, type ExampleValues } from '../endpoints';
import { CodeBlock } from './code-block';

/** One operation of the document: method and path, what it answers, and a curl command for this team. */
export function EndpointCard({ endpoint, examples }: { endpoint: Endpoint; examples: ExampleValues }) {
  const pathParams = endpoint.parameters.filter((p) => p.in === 'path');
  return (
    <Card className="p-4">
      <article aria-labelledby={`op-${endpoint.id}`} data-testid={`endpoint-${endpoint.id}`}>
        <h3 id={`op-${endpoint.id}`} className="flex flex-wrap items-baseline gap-2">
          <span className="rounded border border-ink/40 px-1.5 font-mono text-xs font-semibold dark:border-paper/40">{endpoint.method}</span>
          <code className="break-all font-mono text-sm">{endpoint.path}</code>
          {endpoint.isPublic ? <span className="text-xs text-ink/60 dark:text-paper/60">no token needed</span> : null}
        </h3>
        <p className="mt-1 text-sm">{endpoint.summary}</p>
        {pathParams.length ? (
          <dl className="mt-3 grid grid-cols-[max-content_1fr] gap-x-3 gap-y-1 text-xs">
            {pathParams.map((p) => (
              <div key={p.name} className="contents">
                <dt className="font-mono">{p.name}</dt>
                <dd className="text-ink/75 dark:text-paper/75">{p.description ?? ''}</dd>
              </div>
            ))}
          </dl>
        ) : null}
        <ul className="mt-3 flex flex-wrap gap-x-4 gap-y-1 text-xs" aria-label="Answers">
          {endpoint.responses.map((r) => (
            <li key={r.status} title={r.description}>
              <span className="font-mono font-semibold">{r.status}</span> <span className="text-ink/70 dark:text-paper/70">{shortDescription(r.description)}</span>
            </li>
          ))}
        </ul>
        <div className="mt-3">
          <CodeBlock code={curlFor(endpoint, examples)} testId={`curl-${endpoint.id}`} label={`curl example for ${endpoint.method} ${endpoint.path}`} />
        </div>
      </article>
    </Card>
  );
}

const shortDescription = (d: string) => (d.length > 48 ? `${d.slice(0, d.indexOf(' ', 40) > 0 ? d.indexOf(' ', 40) : 48)}…` : d);
