import { cellCentre } from '../cell-geometry';
import type { ViewerFrame } from '../frames-payload-decoder';
import { createAtomLayer, SPRITE_ATOMS, type AtomLayer } from './atom-layer';
import { AtomStage } from './atom-stage';
import { CellOutline } from './cell-outline';
import { SelectionMarker } from './selection-marker';
import { STAGE_COLOURS } from './stage-style';

/** Species of the system, as the frames API lists them. */
export interface SystemSpecies {
  speciesNames: readonly string[];
  speciesIndex: Uint16Array;
}

/** Centre and radius of what should fill the view: the cell when there is one, else the atoms' bounding box. */
function extentOf(frame: ViewerFrame): { centre: number[]; radius: number } {
  if (frame.cell) {
    const c = frame.cell;
    const diagonal = Math.hypot(c[0]! + c[3]! + c[6]!, c[1]! + c[4]! + c[7]!, c[2]! + c[5]! + c[8]!);
    return { centre: cellCentre(c), radius: diagonal / 2 };
  }
  const low = [Infinity, Infinity, Infinity];
  const high = [-Infinity, -Infinity, -Infinity];
  const p = frame.positions;
  for (let i = 0; i < p.length; i++) {
    const k = i % 3;
    if (p[i]! < low[k]!) low[k] = p[i]!;
    if (p[i]! > high[k]!) high[k] = p[i]!;
  }
  if (!Number.isFinite(low[0]!)) return { centre: [0, 0, 0], radius: 10 };
  return { centre: low.map((l, k) => (l + high[k]!) / 2), radius: Math.hypot(...high.map((h, k) => h - low[k]!)) / 2 + 2 };
}

/** Everything drawn for one frame: spheres, cell, selection; the page drives it. */
export class FrameScene {
  private readonly stage: AtomStage;
  private readonly spheres: AtomLayer;
  private readonly cell = new CellOutline(STAGE_COLOURS.cell);
  private readonly marker = new SelectionMarker(STAGE_COLOURS.selection, STAGE_COLOURS.path);
  private positions: Float32Array | null = null;
  private selected: number | null = null;
  private cellWanted = true;
  private framed = false;

  /** Called with the clicked atom's index, or null for a click on empty space. */
  onPick: (atom: number | null) => void = () => {};

  constructor(canvas: HTMLCanvasElement, system: SystemSpecies) {
    // Multisampling cannot smooth the sprites' edges anyway, and costs software renderers dearly.
    this.stage = new AtomStage(canvas, system.speciesIndex.length <= SPRITE_ATOMS);
    this.spheres = createAtomLayer(system.speciesNames, system.speciesIndex);
    this.stage.add(this.spheres.group, this.cell.lines, this.marker.group);
    this.stage.onClick = (ray) => this.onPick(this.spheres.pick(ray));
  }

  set onDraw(callback: () => void) {
    this.stage.onDraw = callback;
  }

  show(frame: ViewerFrame): void {
    this.positions = frame.positions;
    this.spheres.update(frame.positions);
    this.cell.set(frame.cell);
    this.cell.lines.visible = this.cellWanted && this.cell.hasCell;
    this.placeMarker();
    if (!this.framed) {
      const { centre, radius } = extentOf(frame);
      this.stage.frame(centre, radius);
      this.framed = true;
    }
    this.stage.requestDraw();
  }

  setSpeciesVisible(species: number, visible: boolean): void {
    this.spheres.setSpeciesVisible(species, visible);
    this.stage.requestDraw();
  }

  setCellVisible(visible: boolean): void {
    this.cellWanted = visible;
    this.cell.lines.visible = visible && this.cell.hasCell;
    this.stage.requestDraw();
  }

  select(atom: number | null): void {
    this.selected = atom;
    this.placeMarker();
    this.stage.requestDraw();
  }

  /** Path points oldest first, in Å. */
  setPath(points: Float32Array): void {
    this.marker.setPath(points);
    this.stage.requestDraw();
  }

  dispose(): void {
    this.spheres.dispose();
    this.cell.dispose();
    this.marker.dispose();
    this.stage.dispose();
  }

  private placeMarker(): void {
    const atom = this.selected;
    if (atom === null || !this.positions) {
      this.marker.hide();
      return;
    }
    this.marker.show(this.positions.subarray(atom * 3, atom * 3 + 3), this.spheres.radiusOf(atom));
  }
}
