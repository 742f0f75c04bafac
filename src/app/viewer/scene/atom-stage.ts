import {
  Color, DirectionalLight, HemisphereLight, PerspectiveCamera, Raycaster, Scene, Vector2, Vector3, WebGLRenderer, type Object3D,
} from 'three';
import { OrbitControls } from 'three/examples/jsm/controls/OrbitControls.js';
import { STAGE_COLOURS, STAGE_LIGHTS } from './stage-style';
import { fitDistance } from './fit-distance';

/** Pointer travel, in CSS pixels, under which a press-and-release counts as a click rather than a drag. */
const CLICK_SLOP_PX = 4;

/**
 * The WebGL canvas with its camera, lights and orbit controls. It draws only
 * when something changed (a new frame, a camera move, a resize), coalesced
 * to one draw per animation frame, so a paused viewer costs nothing.
 */
export class AtomStage {
  readonly scene = new Scene();
  readonly camera = new PerspectiveCamera(35, 1, 0.1, 10_000);
  private readonly renderer: WebGLRenderer;
  private readonly controls: OrbitControls;
  private readonly resizeObserver: ResizeObserver;
  /** The sphere last framed, to frame again after a resize. */
  private framed: { centre: [number, number, number]; radius: number } | null = null;
  private cameraMoved = false;
  private readonly raycaster = new Raycaster();
  private pendingDraw = 0;
  private pressedAt: { x: number; y: number } | null = null;

  /** Called after each draw. */
  onDraw: () => void = () => {};
  /** Called with a ray through the point clicked (pressed and released without dragging). */
  onClick: (ray: Raycaster) => void = () => {};

  constructor(private readonly canvas: HTMLCanvasElement, antialias: boolean) {
    this.renderer = new WebGLRenderer({ canvas, antialias, powerPreference: 'high-performance' });
    this.renderer.setPixelRatio(Math.min(globalThis.devicePixelRatio || 1, 2));
    this.scene.background = new Color(STAGE_COLOURS.background);
    // Sky and ground tints keep shadowed sides readable on a pale background; the key light follows the camera.
    this.scene.add(new HemisphereLight(STAGE_LIGHTS.sky, STAGE_LIGHTS.ground, 1.6));
    const key = new DirectionalLight(0xffffff, 1.8);
    key.position.set(0.4, 0.6, 1);
    // With its target on the camera too, the key light keeps one direction in view space (KEY_LIGHT_IN_VIEW).
    key.target.position.set(0, 0, -1);
    this.camera.add(key, key.target);
    this.scene.add(this.camera);

    this.controls = new OrbitControls(this.camera, canvas);
    this.controls.addEventListener('change', () => this.requestDraw());
    this.controls.addEventListener('start', () => { this.cameraMoved = true; });
    this.resizeObserver = new ResizeObserver(() => this.resize());
    this.resizeObserver.observe(canvas.parentElement ?? canvas);
    canvas.addEventListener('pointerdown', this.pointerDown);
    canvas.addEventListener('pointerup', this.pointerUp);
    this.resize();
  }

  add(...objects: Object3D[]): void {
    this.scene.add(...objects);
  }

  /** Looks at a sphere of `radius` around `centre` from a slanted viewpoint. */
  frame(centre: ArrayLike<number>, radius: number): void {
    this.framed = { centre: [centre[0]!, centre[1]!, centre[2]!], radius };
    this.cameraMoved = false;
    const target = new Vector3(centre[0], centre[1], centre[2]);
    const distance = fitDistance(radius, this.camera.fov, this.camera.aspect);
    const direction = new Vector3(0.55, 0.45, 1).normalize();
    this.camera.position.copy(target).addScaledVector(direction, distance);
    this.camera.near = Math.max(0.01, distance / 1000);
    this.camera.far = distance * 10;
    this.camera.updateProjectionMatrix();
    this.controls.target.copy(target);
    this.controls.update();
    this.requestDraw();
  }

  requestDraw(): void {
    if (this.pendingDraw) return;
    this.pendingDraw = requestAnimationFrame(() => {
      this.pendingDraw = 0;
      this.renderer.render(this.scene, this.camera);
      this.onDraw();
    });
  }

  dispose(): void {
    cancelAnimationFrame(this.pendingDraw);
    this.resizeObserver.disconnect();
    this.canvas.removeEventListener('pointerdown', this.pointerDown);
    this.canvas.removeEventListener('pointerup', this.pointerUp);
    this.controls.dispose();
    this.renderer.dispose();
  }

  private resize(): void {
    const box = (this.canvas.parentElement ?? this.canvas).getBoundingClientRect();
    const width = Math.max(1, Math.floor(box.width));
    const height = Math.max(1, Math.floor(box.height));
    this.renderer.setSize(width, height, false);
    this.camera.aspect = width / height;
    this.camera.updateProjectionMatrix();
    // Until the user turns or zooms, a new shape of the window (a phone turned, a panel opened) frames the cell again.
    if (this.framed && !this.cameraMoved) this.frame(this.framed.centre, this.framed.radius);
    else this.requestDraw();
  }

  private readonly pointerDown = (event: PointerEvent): void => {
    this.pressedAt = event.button === 0 ? { x: event.clientX, y: event.clientY } : null;
  };

  private readonly pointerUp = (event: PointerEvent): void => {
    const pressed = this.pressedAt;
    this.pressedAt = null;
    if (!pressed || Math.hypot(event.clientX - pressed.x, event.clientY - pressed.y) > CLICK_SLOP_PX) return;
    const rect = this.canvas.getBoundingClientRect();
    const ndc = new Vector2(((event.clientX - rect.left) / rect.width) * 2 - 1, -((event.clientY - rect.top) / rect.height) * 2 + 1);
    this.raycaster.setFromCamera(ndc, this.camera);
    this.onClick(this.raycaster);
  };
}
