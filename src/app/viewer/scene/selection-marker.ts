import {
  BufferAttribute, BufferGeometry, Group, IcosahedronGeometry, Line, LineBasicMaterial, Mesh, MeshBasicMaterial,
} from 'three';

/** Longest path the marker can draw, in frames. */
export const MAX_PATH_FRAMES = 1000;

/** A translucent shell around the selected atom and the line of its recent path. */
export class SelectionMarker {
  readonly group = new Group();
  private readonly shell: Mesh;
  private readonly path: Line;
  private readonly pathPoints = new Float32Array(MAX_PATH_FRAMES * 3);
  private readonly pathAttribute = new BufferAttribute(this.pathPoints, 3);

  constructor(colour: string, pathColour: string) {
    this.shell = new Mesh(
      new IcosahedronGeometry(1, 2),
      new MeshBasicMaterial({ color: colour, transparent: true, opacity: 0.35, depthWrite: false }),
    );
    const geometry = new BufferGeometry();
    geometry.setAttribute('position', this.pathAttribute);
    geometry.setDrawRange(0, 0);
    // Drawn over the spheres: a path that dips behind neighbours would otherwise break into pieces.
    this.path = new Line(geometry, new LineBasicMaterial({ color: pathColour, depthTest: false }));
    this.path.renderOrder = 1;
    this.path.frustumCulled = false;
    this.group.add(this.shell, this.path);
    this.group.visible = false;
  }

  show(position: ArrayLike<number>, radius: number): void {
    this.shell.position.set(position[0]!, position[1]!, position[2]!);
    this.shell.scale.setScalar(radius * 1.7);
    this.group.visible = true;
  }

  hide(): void {
    this.group.visible = false;
  }

  /** Points oldest first; fewer than two draws no line. */
  setPath(points: Float32Array): void {
    const count = Math.min(MAX_PATH_FRAMES, points.length / 3);
    this.pathPoints.set(points.subarray(points.length - count * 3));
    this.pathAttribute.needsUpdate = true;
    this.path.geometry.setDrawRange(0, count >= 2 ? count : 0);
  }

  dispose(): void {
    this.shell.geometry.dispose();
    (this.shell.material as MeshBasicMaterial).dispose();
    this.path.geometry.dispose();
    (this.path.material as LineBasicMaterial).dispose();
  }
}
