import type { Csr } from '../../extension/src/engine/matrix/csr';
import { denseToCsr } from '../measures-fixtures';

/** Dense rows (documents) → CSR (the measures' builder; one in the tests). */
export function csrOf(dense: number[][]): Csr {
  return denseToCsr(dense);
}
