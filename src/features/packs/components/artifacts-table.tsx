import type { ArtifactDto } from '../../../../shared/schemas/versions';

const FORMAT_LABEL: Record<ArtifactDto['format'], string> = { source: 'source (curve documents)', json: 'JSON tables', binary: 'binary pack', c: 'C99 header', ts: 'TypeScript module', gltf: 'glTF 2.0', css: 'CSS linear()' };

/** Bytes in mono with a unit: 812 B, 3.4 KiB. */
export function formatBytes(n: number): string {
  return n < 1024 ? `${n} B` : n < 1024 * 1024 ? `${(n / 1024).toFixed(1)} KiB` : `${(n / 1024 / 1024).toFixed(2)} MiB`;
}

/** Every stored object of a version with its size and SHA-256, each a download. */
export function ArtifactsTable({ artifacts, href, downloadName }: { artifacts: ArtifactDto[]; href: (a: ArtifactDto) => string; downloadName: (a: ArtifactDto) => string }) {
  return (
    <table className="w-full text-left text-sm" aria-label="Artifacts">
      <thead>
        <tr className="border-b border-grid-major dark:border-night-line">
          <th scope="col" className="py-1 pr-3">Target</th>
          <th scope="col" className="py-1 pr-3">Format</th>
          <th scope="col" className="py-1 pr-3 text-right">Size</th>
          <th scope="col" className="py-1 pr-3">SHA-256</th>
          <th scope="col" className="py-1"><span className="sr-only">Download</span></th>
        </tr>
      </thead>
      <tbody>
        {artifacts.map((a) => (
          <tr key={a.id} className="border-b border-grid-minor dark:border-night-line">
            <th scope="row" className="py-1 pr-3 font-medium">{a.profileName ?? 'all'}</th>
            <td className="py-1 pr-3">{FORMAT_LABEL[a.format]}</td>
            <td className="py-1 pr-3 text-right font-mono">{formatBytes(a.size)}</td>
            <td className="py-1 pr-3 font-mono text-xs"><span title={a.sha256}>{a.sha256.slice(0, 16)}…</span></td>
            <td className="py-1"><a href={href(a)} download={downloadName(a)} className="underline">Download {downloadName(a)}</a></td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
