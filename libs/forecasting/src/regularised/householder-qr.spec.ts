/**
 * Householder QR checks: QᵀQ-free identities that any correct factorisation satisfies — RᵀR = AᵀA and
 * Rβ = Qᵀb solving least squares — against ml-matrix's own QR solve (an independent implementation), to 1e-10.
 */
import { Matrix, QrDecomposition } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { backSubstitute, householderQr, invertUpperTriangular } from './householder-qr';

describe('householderQr', () => {
  const columns = [
    Float64Array.from([1, 2, 3, 4, 5, 6]),
    Float64Array.from([2, -1, 0, 3, 1, -2]),
    Float64Array.from([0.5, 0.5, -1, 2, -3, 1]),
  ];
  const b = Float64Array.from([1, 0, 2, -1, 3, 2]);

  it('gives RᵀR = AᵀA', () => {
    const { r, k } = householderQr(columns, b);
    for (let i = 0; i < k; i++) {
      for (let j = 0; j < k; j++) {
        let rtr = 0;
        for (let l = 0; l < k; l++) rtr += r[l * k + i] * r[l * k + j];
        const ata = columns[i].reduce((s, v, row) => s + v * columns[j][row], 0);
        expect(rtr).toBeCloseTo(ata, 10);
      }
    }
  });

  it('solves least squares like ml-matrix QR', () => {
    const { r, k, qtb } = householderQr(columns, b);
    const beta = backSubstitute(r, k, qtb);
    const a = new Matrix(6, 3);
    columns.forEach((c, j) => c.forEach((v, i) => a.set(i, j, v)));
    const expected = new QrDecomposition(a).solve(Matrix.columnVector(Array.from(b))).getColumn(0);
    beta.forEach((v, i) => expect(v).toBeCloseTo(expected[i], 10));
  });

  it('inverts an upper triangular matrix', () => {
    const r = Float64Array.from([2, 1, -1, 0, 3, 2, 0, 0, 4]);
    const inverse = invertUpperTriangular(r, 3);
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) {
        let s = 0;
        for (let l = 0; l < 3; l++) s += r[i * 3 + l] * inverse[l * 3 + j];
        expect(s).toBeCloseTo(i === j ? 1 : 0, 14);
      }
    }
  });
});
