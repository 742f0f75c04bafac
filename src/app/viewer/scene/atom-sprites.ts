import { BufferAttribute, BufferGeometry, DynamicDrawUsage, Group, Points, type Raycaster, type ShaderMaterial } from 'three';
import { nearestSphereHit, type SphereHit } from '../ray-pick';
import { atomsBySpecies, gatherPositions } from '../species-positions';
import { SPHERE_SCALE, speciesStyle } from '../species-style';
import type { AtomLayer } from './atom-layer';
import { STAGE_LIGHTS } from './stage-style';
import { spriteMaterial, updateSpriteUniforms } from './sprite-material';

/**
 * Atoms as shaded point sprites, one object per species: a single vertex per
 * atom, which software renderers draw many times faster than 50 000 mesh
 * instances.
 */
export class AtomSprites implements AtomLayer {
  readonly group = new Group();
  private readonly members: Uint32Array[];
  private readonly points: Points<BufferGeometry, ShaderMaterial>[];
  private readonly radii: number[];
  private readonly speciesOf: Uint16Array;
  private positions: Float32Array | null = null;

  constructor(speciesNames: readonly string[], speciesIndex: Uint16Array) {
    this.speciesOf = speciesIndex;
    this.members = atomsBySpecies(speciesIndex, speciesNames.length);
    const styles = speciesNames.map(speciesStyle);
    this.radii = styles.map((s) => s.radiusA * SPHERE_SCALE);
    this.points = styles.map((style, s) => {
      const geometry = new BufferGeometry();
      const attribute = new BufferAttribute(new Float32Array(this.members[s]!.length * 3), 3);
      attribute.setUsage(DynamicDrawUsage);
      geometry.setAttribute('position', attribute);
      const points = new Points(geometry, spriteMaterial(style.colour, this.radii[s]!, STAGE_LIGHTS.sky, STAGE_LIGHTS.ground));
      points.frustumCulled = false;
      points.onBeforeRender = (renderer, _scene, camera) => updateSpriteUniforms(points.material, renderer, camera);
      this.group.add(points);
      return points;
    });
  }

  radiusOf(atom: number): number {
    return this.radii[this.speciesOf[atom] ?? 0] ?? 0;
  }

  update(positions: Float32Array): void {
    this.positions = positions;
    this.points.forEach((points, s) => {
      const attribute = points.geometry.getAttribute('position') as BufferAttribute;
      gatherPositions(attribute.array as Float32Array, this.members[s]!, positions);
      attribute.needsUpdate = true;
    });
  }

  setSpeciesVisible(species: number, visible: boolean): void {
    const points = this.points[species];
    if (points) points.visible = visible;
  }

  pick(raycaster: Raycaster): number | null {
    const positions = this.positions;
    if (!positions) return null;
    let best: SphereHit | null = null;
    for (let s = 0; s < this.points.length; s++) {
      if (!this.points[s]!.visible) continue;
      const hit = nearestSphereHit(raycaster.ray, positions, this.members[s]!, this.radii[s]!);
      if (hit && (!best || hit.distance < best.distance)) best = hit;
    }
    return best?.atom ?? null;
  }

  dispose(): void {
    for (const points of this.points) {
      points.geometry.dispose();
      points.material.dispose();
    }
  }
}
