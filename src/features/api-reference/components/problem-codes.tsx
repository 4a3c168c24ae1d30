/**
 * The stable problem codes of /api/v1 (server/api-v1/problem.ts). Each has an anchor: a problem
 * detail's `type` is this page's URL with #problem-<code>.
 */
import { TableHead } from '../../../components/table-head';

const CODES: { code: string; status: number; meaning: string }[] = [
  { code: 'unauthenticated', status: 401, meaning: 'No token or session, or the token is malformed, unknown or revoked.' },
  { code: 'forbidden', status: 403, meaning: 'Your role in the team does not allow this.' },
  { code: 'token_read_only', status: 403, meaning: 'Service tokens only read.' },
  { code: 'not_found', status: 404, meaning: 'No such team among yours, or pack (or one your token may not read), channel, version, target or format.' },
  { code: 'invalid_request', status: 400, meaning: 'A path parameter is malformed; errors[] names each field.' },
  { code: 'rate_limited', status: 429, meaning: 'Too many requests in the window; wait for Retry-After seconds.' },
  { code: 'storage_unavailable', status: 503, meaning: 'The library bucket did not answer; try again.' },
  { code: 'database_unavailable', status: 503, meaning: 'The database did not answer; the request was not carried out. Try again after Retry-After seconds.' },
  { code: 'internal', status: 500, meaning: 'A server fault; it has been logged.' },
];

export function ProblemCodes() {
  return (
    <table className="w-full text-left text-sm">
      <TableHead columns={['code', 'status', 'meaning']} />
      <tbody className="divide-y divide-grid-minor dark:divide-night-line">
        {CODES.map((c) => (
          <tr key={c.code} id={`problem-${c.code}`} className="target:bg-amber/10">
            <td className="py-2 pr-3 font-mono text-xs">{c.code}</td>
            <td className="py-2 pr-3 font-mono text-xs">{c.status}</td>
            <td className="py-2">{c.meaning}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
