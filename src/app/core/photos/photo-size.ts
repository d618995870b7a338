/** The long edge photos are kept at: sharp enough to show a burr or a bent runner, small enough to sync from a hut. */
export const photoLongEdgePx = 1600;
export const photoJpegQuality = 0.85;

/** The size a picture is scaled to so its long edge is at most `longEdge`, keeping its shape; never enlarged. */
export function fitWithin(width: number, height: number, longEdge: number = photoLongEdgePx): { width: number; height: number } {
  if (!(width > 0 && height > 0)) throw new RangeError(`A picture has a size above zero, not ${width} × ${height}.`);
  const scale = Math.min(1, longEdge / Math.max(width, height));
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}
