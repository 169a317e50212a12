import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

/** Every eigenpair of a symmetric n × n row-major matrix, eigenvalues descending. */
export function allEigenpairs(b: Float64Array, n: number): { values: number[]; vectors: Float64Array[] } {
  const rows = Array.from({ length: n }, (_, i) => Array.from(b.subarray(i * n, (i + 1) * n)));
  const decomposition = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true });
  const values = decomposition.realEigenvalues;
  const vectors = decomposition.eigenvectorMatrix;
  const order = values.map((_, i) => i).sort((i, j) => values[j] - values[i]);
  return {
    values: order.map((i) => values[i]),
    vectors: order.map((i) => Float64Array.from(vectors.getColumn(i))),
  };
}
