/** Named points on a box, used by joins. */
import type { Box, Point } from './geometry';
import type { AnchorName } from './schema';

export function anchorPoint(box: Box, name: AnchorName): Point {
  const cx = (box.minX + box.maxX) / 2, cy = (box.minY + box.maxY) / 2;
  switch (name) {
    case 'bottom-left': return [box.minX, box.minY];
    case 'bottom-center': return [cx, box.minY];
    case 'bottom-right': return [box.maxX, box.minY];
    case 'middle-left': return [box.minX, cy];
    case 'center': return [cx, cy];
    case 'middle-right': return [box.maxX, cy];
    case 'top-left': return [box.minX, box.maxY];
    case 'top-center': return [cx, box.maxY];
    case 'top-right': return [box.maxX, box.maxY];
  }
}
