import type { TermRow } from '../../protocol';

const pct = (x: number): string => (x >= 0.1 ? `${(x * 100).toFixed(0)}%` : x >= 0.001 ? `${(x * 100).toFixed(1)}%` : `${(x * 100).toFixed(2)}%`);
const times = (x: number | null): string => (x === null ? 'no' : `${x.toFixed(2)}×`);

/** One line a person can read: why the term is (or is not) suggested. */
export function explainTerm(row: TermRow, documents: number, how: { fromPrior: boolean; rejected: boolean }): string {
  const inDocs = `in ${pct(row.df / Math.max(1, documents))} of documents`;
  const pull = `${pct(row.pullShare)} of all-pair similarity`;
  const lift = `${times(row.neighborLift)} that share among nearest neighbours`;
  switch (row.status) {
    case 'stopped':
      if (row.neighborLift !== null && row.neighborLift >= 1.5) {
        return `on the stop list, yet it carries neighbour signal (${lift}); consider removing it from the list`;
      }
      return `on the stop list; unstopped it would carry ${pull}, ${lift}`;
    case 'suggested':
      return how.fromPrior
        ? `function word ${inDocs}; carries ${pull}, ${lift}; removing it passed the what-if check`
        : `loud: ${inDocs}, carries ${pull} but ${lift}; removing it made neighbours stand out more`;
    case 'protected':
      return `protected: removing it can flip meaning (negation or a word named in "suggest.protect")`;
    case 'kept':
      if (how.rejected) return `loud (${pull}, ${lift}), but the what-if showed neighbours got worse without it`;
      if (row.neighborLift !== null && row.neighborLift >= 1) return `neighbour signal: ${lift}; ${inDocs}`;
      return `${inDocs}; carries ${pull}, ${lift}`;
  }
}
