import type { Locator, Page } from '@playwright/test';

export interface CanvasPixels {
  width: number;
  height: number;
  /** Pixels that differ clearly from the background colour. */
  drawn: number;
  /** A point (CSS pixels, relative to the canvas) inside a drawn disc, not on a thin line; null when there is none. */
  solidPoint: { x: number; y: number } | null;
}

/**
 * Reads what the user sees: a screenshot of the canvas, decoded in the page
 * (the app's CSP allows no data: fetches, so the PNG goes through a Blob).
 */
export async function canvasPixels(page: Page, canvas: Locator, background: [number, number, number]): Promise<CanvasPixels> {
  const png = (await canvas.screenshot()).toString('base64');
  const box = await canvas.boundingBox();
  return page.evaluate(async ({ png, background, cssWidth }) => {
    const bytes = Uint8Array.from(atob(png), (c) => c.charCodeAt(0));
    const bitmap = await createImageBitmap(new Blob([bytes], { type: 'image/png' }));
    const surface = new OffscreenCanvas(bitmap.width, bitmap.height);
    const ctx = surface.getContext('2d')!;
    ctx.drawImage(bitmap, 0, 0);
    const { data, width, height } = ctx.getImageData(0, 0, bitmap.width, bitmap.height);
    const drawnAt = (x: number, y: number) => {
      const o = (y * width + x) * 4;
      return Math.abs(data[o]! - background[0]) + Math.abs(data[o + 1]! - background[1]) + Math.abs(data[o + 2]! - background[2]) > 40;
    };
    let drawn = 0;
    for (let y = 0; y < height; y++) for (let x = 0; x < width; x++) if (drawnAt(x, y)) drawn++;
    // A point whose whole 9×9 neighbourhood is drawn lies inside a sphere, never on a 1-pixel cell edge.
    const solid = (x: number, y: number) => {
      for (let dy = -4; dy <= 4; dy++) for (let dx = -4; dx <= 4; dx++) if (!drawnAt(x + dx, y + dy)) return false;
      return true;
    };
    let solidPoint: { x: number; y: number } | null = null;
    const cx = Math.floor(width / 2), cy = Math.floor(height / 2);
    // Nearest to the centre first, where spheres are least likely to be half hidden by the frame.
    for (let r = 0; r < Math.max(cx, cy) - 5 && !solidPoint; r += 3) {
      for (let a = 0; a < 64 && !solidPoint; a++) {
        const x = Math.round(cx + r * Math.cos((a / 64) * 2 * Math.PI));
        const y = Math.round(cy + r * Math.sin((a / 64) * 2 * Math.PI));
        if (x >= 5 && y >= 5 && x < width - 5 && y < height - 5 && solid(x, y)) solidPoint = { x, y };
      }
    }
    const scale = cssWidth ? width / cssWidth : 1;
    return { width, height, drawn, solidPoint: solidPoint && { x: solidPoint.x / scale, y: solidPoint.y / scale } };
  }, { png, background, cssWidth: box?.width ?? 0 });
}
