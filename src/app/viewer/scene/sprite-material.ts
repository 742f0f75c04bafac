import { Color, ShaderMaterial, Vector2, Vector3, type Camera, type WebGLRenderer } from 'three';

/**
 * Spheres drawn as shaded point sprites: one vertex per atom instead of a
 * mesh per atom. Lighting imitates the stage's lights (a sky/ground
 * hemisphere and a key light fixed to the camera) so both ways of drawing
 * look alike.
 */
const vertexShader = /* glsl */ `
  uniform float radius;
  uniform float viewportHeight;
  void main() {
    vec4 centre = modelViewMatrix * vec4(position, 1.0);
    gl_Position = projectionMatrix * centre;
    gl_PointSize = radius * projectionMatrix[1][1] * viewportHeight / -centre.z;
  }
`;

const fragmentShader = /* glsl */ `
  uniform vec3 colour;
  uniform vec3 skyTint;
  uniform vec3 groundTint;
  uniform vec3 upInView;
  uniform vec3 keyInView;
  void main() {
    vec2 v = gl_PointCoord * 2.0 - 1.0;
    v.y = -v.y;
    float r2 = dot(v, v);
    if (r2 > 1.0) discard;
    vec3 n = vec3(v, sqrt(1.0 - r2));
    vec3 hemisphere = mix(groundTint, skyTint, 0.5 * dot(n, upInView) + 0.5) * 1.6;
    float diffuse = max(dot(n, keyInView), 0.0) * 1.8;
    float highlight = pow(max(dot(n, normalize(keyInView + vec3(0.0, 0.0, 1.0))), 0.0), 40.0) * 0.35;
    gl_FragColor = vec4(colour * (hemisphere + diffuse) * 0.31831 + highlight, 1.0);
    #include <colorspace_fragment>
  }
`;

/** The key light's direction in view space, as the stage places it (see AtomStage). */
export const KEY_LIGHT_IN_VIEW = new Vector3(0.4, 0.6, 2).normalize();

const buffer = new Vector2();
const worldUp = new Vector3();

export function spriteMaterial(colour: string, radius: number, sky: number, ground: number): ShaderMaterial {
  const material = new ShaderMaterial({
    uniforms: {
      colour: { value: new Color(colour) },
      radius: { value: radius },
      viewportHeight: { value: 1 },
      skyTint: { value: new Color(sky) },
      groundTint: { value: new Color(ground) },
      upInView: { value: new Vector3(0, 1, 0) },
      keyInView: { value: KEY_LIGHT_IN_VIEW.clone() },
    },
    vertexShader,
    fragmentShader,
  });
  return material;
}

/** Per-draw uniforms: sprite size follows the drawing buffer, the sky follows the camera. */
export function updateSpriteUniforms(material: ShaderMaterial, renderer: WebGLRenderer, camera: Camera): void {
  material.uniforms['viewportHeight']!.value = renderer.getDrawingBufferSize(buffer).y;
  (material.uniforms['upInView']!.value as Vector3).copy(worldUp.set(0, 1, 0).transformDirection(camera.matrixWorldInverse));
}
