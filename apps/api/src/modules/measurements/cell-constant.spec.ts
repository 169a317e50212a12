import { cellConstantPerCm } from './cell-constant';

describe('cell constant from a KCl standard', () => {
  it('gives 1.0000 cm⁻¹ for 1413 µS/cm and a 707.714 Ω plateau', () => {
    // REFERENCES.md "Conductivity standards": 1413 µS/cm and R = 707.714 Ω → K = 1.0000 cm⁻¹
    // (0.01 mol/L KCl ≈ 1413 µS/cm at 25 °C is common practice, printed on commercial standards).
    expect(cellConstantPerCm(1413, 707.714)).toBeCloseTo(1.0, 4);
  });

  it('refuses a zero resistance instead of storing a cell constant of 0', () => {
    expect(() => cellConstantPerCm(1413, 0)).toThrow(RangeError);
  });
});
