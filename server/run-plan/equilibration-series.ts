/**
 * Collects, while inspection reads the frames, the one per-frame series
 * from which the equilibration start is judged: the kinetic energy when the
 * file has velocities (masses from the element symbols, or equal masses when
 * the labels are not elements: the shape is what matters), else an energy
 * the file states per frame, else the cell volume when the cell changes.
 */
import { massOf } from '../../shared/elements.ts';
import type { Frame } from '../formats/frame.ts';
import { equilibrationStart } from './equilibration-start.ts';

type Kind = 'kinetic energy' | 'file energy' | 'cell volume';

export class EquilibrationSeries {
  private kind: Kind | null = null;
  private key = '';
  private masses: Float64Array | null = null;
  private values = new Float64Array(1024);
  private count = 0;
  private usable = true;

  add(frame: Frame & { values?: Record<string, number> }): void {
    if (!this.usable) return;
    if (this.count === 0) this.begin(frame);
    const v = this.valueOf(frame);
    if (v === null || !Number.isFinite(v)) {
      this.usable = false;
      return;
    }
    if (this.count === this.values.length) {
      const grown = new Float64Array(this.values.length * 2);
      grown.set(this.values);
      this.values = grown;
    }
    this.values[this.count++] = v;
  }

  /** The first frame judged equilibrated and what it was judged from, or null. */
  result(): { frame: number; judgedFrom: string } | null {
    if (!this.usable || !this.kind) return null;
    const start = equilibrationStart(this.values.subarray(0, this.count));
    if (!start) return null;
    return { frame: start.frame, judgedFrom: this.kind === 'file energy' ? `the file's "${this.key}"` : `the ${this.kind}` };
  }

  private begin(frame: Frame & { values?: Record<string, number> }): void {
    if (frame.velocities) {
      this.kind = 'kinetic energy';
      try {
        this.masses = Float64Array.from(frame.species, (s) => massOf(s));
      } catch {
        this.masses = new Float64Array(frame.species.length).fill(1);
      }
      return;
    }
    const keys = Object.keys(frame.values ?? {});
    const energy = ['potential_energy', 'potential', 'energy', 'total_energy', 'etot'].find((k) => keys.includes(k)) ?? keys.find((k) => k.includes('energy'));
    if (energy) {
      this.kind = 'file energy';
      this.key = energy;
    } else if (frame.cell) {
      this.kind = 'cell volume';
    } else {
      this.usable = false;
    }
  }

  private valueOf(frame: Frame & { values?: Record<string, number> }): number | null {
    switch (this.kind) {
      case 'kinetic energy': {
        const v = frame.velocities;
        if (!v) return null;
        const m = this.masses!;
        let sum = 0;
        for (let i = 0; i < m.length; i++) sum += m[i]! * (v[3 * i]! ** 2 + v[3 * i + 1]! ** 2 + v[3 * i + 2]! ** 2);
        return sum;
      }
      case 'file energy':
        return frame.values?.[this.key] ?? null;
      case 'cell volume': {
        const c = frame.cell;
        if (!c) return null;
        return Math.abs(c[0]! * (c[4]! * c[8]! - c[5]! * c[7]!) - c[1]! * (c[3]! * c[8]! - c[5]! * c[6]!) + c[2]! * (c[3]! * c[7]! - c[4]! * c[6]!));
      }
      default:
        return null;
    }
  }
}
