import { DynamicDrawUsage, Group, IcosahedronGeometry, InstancedMesh, MeshPhongMaterial, type BufferGeometry, type Raycaster } from 'three';
import { mergeVertices } from 'three/examples/jsm/utils/BufferGeometryUtils.js';
import { initialiseScaledMatrices, writeTranslations } from '../instance-matrices';
import { atomsBySpecies } from '../species-positions';
import { SPHERE_SCALE, speciesStyle } from '../species-style';
import type { AtomLayer } from './atom-layer';

/** Fewer facets per sphere as systems grow. */
export function sphereDetail(atoms: number): number {
  return atoms > 2_000 ? 1 : 2;
}

function sphereGeometry(atoms: number): BufferGeometry {
  const geometry = new IcosahedronGeometry(1, sphereDetail(atoms));
  // Shared corners are drawn once when the mesh is indexed; texture seams would stop them merging.
  geometry.deleteAttribute('uv');
  return mergeVertices(geometry);
}

/** One instanced mesh of spheres per species; species visibility is then one flag per mesh. */
export class AtomSpheres implements AtomLayer {
  readonly group = new Group();
  private readonly geometry: BufferGeometry;
  private readonly meshes: InstancedMesh[];
  private readonly members: Uint32Array[];
  private readonly radii: Float32Array;

  constructor(speciesNames: readonly string[], speciesIndex: Uint16Array) {
    this.geometry = sphereGeometry(speciesIndex.length);
    this.members = atomsBySpecies(speciesIndex, speciesNames.length);
    const styles = speciesNames.map(speciesStyle);
    this.radii = Float32Array.from(speciesIndex, (s) => styles[s]!.radiusA * SPHERE_SCALE);
    this.meshes = styles.map((style, s) => {
      const count = this.members[s]!.length;
      const material = new MeshPhongMaterial({ color: style.colour, shininess: 40, specular: 0x303030 });
      const mesh = new InstancedMesh(this.geometry, material, count);
      mesh.instanceMatrix.setUsage(DynamicDrawUsage);
      initialiseScaledMatrices(this.matricesOf(mesh), count, style.radiusA * SPHERE_SCALE);
      // The system is normally all in view, and culling would need a bounding sphere recomputed every frame.
      mesh.frustumCulled = false;
      this.group.add(mesh);
      return mesh;
    });
  }

  /** Drawn radius of an atom's sphere, Å. */
  radiusOf(atom: number): number {
    return this.radii[atom] ?? 0;
  }

  update(positions: Float32Array): void {
    this.meshes.forEach((mesh, s) => {
      writeTranslations(this.matricesOf(mesh), this.members[s]!, positions);
      mesh.instanceMatrix.needsUpdate = true;
      // Picking recomputes it lazily from the new positions.
      mesh.boundingSphere = null;
    });
  }

  setSpeciesVisible(species: number, visible: boolean): void {
    const mesh = this.meshes[species];
    if (mesh) mesh.visible = visible;
  }

  /** The nearest visible atom under the ray, or null. */
  pick(raycaster: Raycaster): number | null {
    const visible = this.meshes.filter((m) => m.visible);
    const hit = raycaster.intersectObjects(visible, false).find((h) => h.instanceId !== undefined);
    if (!hit || hit.instanceId === undefined) return null;
    const species = this.meshes.indexOf(hit.object as InstancedMesh);
    return this.members[species]?.[hit.instanceId] ?? null;
  }

  dispose(): void {
    for (const mesh of this.meshes) {
      (mesh.material as MeshPhongMaterial).dispose();
      mesh.dispose();
    }
    this.geometry.dispose();
  }

  private matricesOf(mesh: InstancedMesh): Float32Array {
    return mesh.instanceMatrix.array as Float32Array;
  }
}
