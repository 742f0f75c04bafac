import { describe, expect, it } from 'vitest';
import { cellCentre, cellEdges, cellLengths, invertCell, minimumImage } from './cell-geometry';

const cubic = [10, 0, 0, 0, 10, 0, 0, 0, 10];
const triclinic = [10, 0, 0, 3, 9, 0, 1, 2, 8];

function segments(edges: Float32Array): number[][][] {
  const out: number[][][] = [];
  for (let s = 0; s < edges.length; s += 6) out.push([Array.from(edges.slice(s, s + 3)), Array.from(edges.slice(s + 3, s + 6))]);
  return out;
}

describe('cellEdges', () => {
  it('when the cell is cubic, then it has 12 edges of the box length along the axes', () => {
    const edges = segments(cellEdges(cubic));
    expect(edges).toHaveLength(12);
    for (const [p, q] of edges) {
      const d = p!.map((v, k) => Math.abs(q![k]! - v));
      expect(d.filter((v) => v === 10)).toHaveLength(1);
      expect(d.filter((v) => v === 0)).toHaveLength(2);
    }
  });

  it('when the cell is triclinic, then every edge is parallel to a, b or c and each direction appears four times', () => {
    const vectors = [triclinic.slice(0, 3), triclinic.slice(3, 6), triclinic.slice(6, 9)];
    const uses = [0, 0, 0];
    for (const [p, q] of segments(cellEdges(triclinic))) {
      const d = q!.map((v, k) => v - p![k]!);
      const match = vectors.findIndex((v) => v.every((c, k) => Math.abs(Math.abs(c) - Math.abs(d[k]!)) < 1e-5));
      expect(match).toBeGreaterThanOrEqual(0);
      uses[match]!++;
    }
    expect(uses).toEqual([4, 4, 4]);
  });

  it('when the edges are drawn, then they span the origin corner to the a+b+c corner', () => {
    const points = segments(cellEdges(triclinic)).flat();
    expect(points).toContainEqual([0, 0, 0]);
    expect(points).toContainEqual([14, 11, 8]);
  });
});

describe('cell lengths, centre and inverse', () => {
  it('when given lattice vectors, then the lengths and centre follow from them', () => {
    const [a, b, c] = cellLengths(triclinic);
    expect(a).toBeCloseTo(10, 12);
    expect(b).toBeCloseTo(Math.hypot(3, 9), 12);
    expect(c).toBeCloseTo(Math.hypot(1, 2, 8), 12);
    expect(cellCentre(triclinic)).toEqual([7, 5.5, 4]);
  });

  it('when the inverse is multiplied by the cell, then the identity comes out', () => {
    const inverse = invertCell(triclinic)!;
    for (let r = 0; r < 3; r++) {
      for (let c = 0; c < 3; c++) {
        let sum = 0;
        for (let k = 0; k < 3; k++) sum += triclinic[r * 3 + k]! * inverse[k * 3 + c]!;
        expect(sum).toBeCloseTo(r === c ? 1 : 0, 12);
      }
    }
  });

  it('when the cell is flat, then it has no inverse', () => {
    expect(invertCell([1, 0, 0, 0, 1, 0, 0, 0, 0])).toBeNull();
  });
});

describe('minimumImage', () => {
  it('when a step crosses the cubic boundary, then it becomes the short step', () => {
    const d = Float64Array.from([9.5, -9, 0.2]);
    minimumImage(d, cubic, invertCell(cubic)!);
    expect(Array.from(d).map((v) => Number(v.toFixed(9)))).toEqual([-0.5, 1, 0.2]);
  });

  it('when a step is a lattice vector plus a small one in a triclinic cell, then the lattice vector is removed', () => {
    const small = [0.3, -0.2, 0.1];
    const d = Float64Array.from(small.map((v, k) => v + triclinic[3 + k]! - triclinic[6 + k]!));
    minimumImage(d, triclinic, invertCell(triclinic)!);
    small.forEach((v, k) => expect(d[k]).toBeCloseTo(v, 9));
  });
});
