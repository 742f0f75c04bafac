import { BufferAttribute, BufferGeometry, LineBasicMaterial, LineSegments } from 'three';
import { cellEdges } from '../cell-geometry';

/** The periodic cell as 12 line segments, rebuilt only when the cell itself changes. */
export class CellOutline {
  readonly lines: LineSegments;
  private readonly positions = new Float32Array(72);
  private readonly attribute = new BufferAttribute(this.positions, 3);
  private current: number[] | null = null;

  constructor(colour: string) {
    const geometry = new BufferGeometry();
    geometry.setAttribute('position', this.attribute);
    this.lines = new LineSegments(geometry, new LineBasicMaterial({ color: colour }));
    this.lines.visible = false;
  }

  /** Returns true when the outline changed. */
  set(cell: Float64Array | null): boolean {
    const next = cell ? Array.from(cell) : null;
    if (next?.join() === this.current?.join()) return false;
    this.current = next;
    if (next) {
      this.positions.set(cellEdges(next));
      this.attribute.needsUpdate = true;
      this.lines.geometry.computeBoundingSphere();
    }
    return true;
  }

  get hasCell(): boolean {
    return this.current !== null;
  }

  dispose(): void {
    this.lines.geometry.dispose();
    (this.lines.material as LineBasicMaterial).dispose();
  }
}
