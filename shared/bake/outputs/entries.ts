/**
 * The logical entries of a table, as the JSON output shows them: a slope break stored as two entries
 * with the same time and value becomes one entry with separate in- and out-slopes; a jump stays a
 * repeated time. slopesIn equals slopesOut everywhere else.
 */
import type { Table } from '../table';

export interface LogicalEntries {
  times: number[];
  values: number[];
  slopesIn: number[];
  slopesOut: number[];
}

export function logicalEntries(tab: Table): LogicalEntries {
  const out: LogicalEntries = { times: [], values: [], slopesIn: [], slopesOut: [] };
  const T = tab.times, V = tab.values, M = tab.slopes;
  for (let k = 0; k < tab.count; k++) {
    out.times.push(T[k]);
    out.values.push(V[k]);
    if (!M) continue;
    if (k + 1 < tab.count && T[k + 1] === T[k] && V[k + 1] === V[k]) {
      out.slopesIn.push(M[k]);
      out.slopesOut.push(M[k + 1]);
      k++;
    } else {
      out.slopesIn.push(M[k]);
      out.slopesOut.push(M[k]);
    }
  }
  return out;
}
