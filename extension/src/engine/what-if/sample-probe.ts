import type { Csr } from '../matrix/csr';
import { maskTerms, type CsrBuffers } from '../matrix/mask-terms';
import { selectRows } from '../matrix/select-rows';
import { validRowsFromGram } from '../measures/gram-distances';
import { knnFromSimilarities } from '../measures/knn';
import { labelPrecisionAtK } from '../measures/label-precision';
import { neighborStandout } from '../measures/neighbor-standout';
import { sampleSimilarities } from '../measures/sample-similarity';

/** What the suggestion search needs to judge one candidate stop list. */
export interface ProbeResult {
  neighbors: Uint32Array;
  neighborStandout: number | null;
  labelPrecisionAtK: number | null;
}

/** Documents in the probe: the similarity matrix costs ~m², so a quarter of the default sample. */
export const PROBE_DOCUMENTS = 1000;

/**
 * The cheap what-if used while searching for suggestions: every other (or every n-th) document of
 * the review's sample, up to PROBE_DOCUMENTS; only those rows are masked and renormalised, and
 * only neighbours, standout and label precision are computed. Candidate lists are compared on
 * the same documents, so the comparison is paired. The full measures run once at the end, on
 * the chosen list, on the whole sample.
 */
export class SampleProbe {
  /** 0..p−1: probe positions, for functions that take (rows, sample) pairs. */
  readonly identity: Uint32Array;
  private readonly labels: Int32Array | null;
  private readonly rows: Csr;
  private readonly buffers: CsrBuffers;

  /** `sampleRows`: the review's sampled rows in sample order; `sampleLabels` per sample position. */
  constructor(sampleRows: Csr, readonly k: number, sampleLabels: Int32Array | null) {
    const m = sampleRows.rows;
    const stride = Math.max(1, Math.ceil(m / PROBE_DOCUMENTS));
    const picked = Uint32Array.from({ length: Math.ceil(m / stride) }, (_, i) => i * stride);
    this.labels = sampleLabels === null ? null : Int32Array.from(picked, (i) => sampleLabels[i]!);
    this.rows = selectRows(sampleRows, picked);
    this.identity = new Uint32Array(picked.length).map((_, i) => i);
    const nnz = this.rows.indptr[this.rows.rows]!;
    this.buffers = { indptr: new Uint32Array(this.rows.rows + 1), indices: new Uint32Array(nnz), data: new Float64Array(nnz) };
  }

  /** The probe's rows with `removed` stopped (reused buffers: valid until the next call). */
  maskedRows(removed: Uint8Array): Csr {
    return maskTerms(this.rows, removed, 'l2', this.buffers);
  }

  evaluate(removed: Uint8Array): ProbeResult {
    const m = this.identity.length;
    const x = this.maskedRows(removed);
    const gram = sampleSimilarities(x, this.identity);
    const valid = validRowsFromGram(gram, m);
    const knn = knnFromSimilarities(gram, m, this.k, valid);
    const nearest = new Float64Array(m);
    for (let i = 0; i < m; i++) nearest[i] = knn.sims[i * this.k]!;
    return {
      neighbors: knn.neighbors,
      neighborStandout: neighborStandout(gram, m, valid, nearest),
      labelPrecisionAtK: this.labels === null ? null : labelPrecisionAtK(knn, this.labels, this.k),
    };
  }
}
