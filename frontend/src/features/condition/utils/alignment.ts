import type { AlignmentInput } from '@/features/condition/api/alignment';
import { round4 } from '@/features/condition/utils/region';

/** How the later image sits over the base: offsets as fractions of the base's width and height. */
export interface AlignmentState {
  offsetX: number;
  offsetY: number;
  scale: number;
  rotationDeg: number;
}

export const IDENTITY: AlignmentState = { offsetX: 0, offsetY: 0, scale: 1, rotationDeg: 0 };

const clamp = (n: number, min: number, max: number) => (Number.isFinite(n) ? Math.min(max, Math.max(min, n)) : min);

/** Keeps every value inside what the server accepts. */
export function clampAlignment(state: AlignmentState): AlignmentState {
  return {
    offsetX: round4(clamp(state.offsetX, -1, 1)),
    offsetY: round4(clamp(state.offsetY, -1, 1)),
    scale: round4(clamp(state.scale, 0.1, 10)),
    rotationDeg: round4(clamp(state.rotationDeg, -45, 45)),
  };
}

/** Moves the overlay by (dx, dy) steps of `step` (a fraction of the base image). */
export function nudge(state: AlignmentState, dx: number, dy: number, step: number): AlignmentState {
  return clampAlignment({ ...state, offsetX: state.offsetX + dx * step, offsetY: state.offsetY + dy * step });
}

/** The CSS transform of the overlay: percentages of the base image's box. */
export function overlayTransform(state: AlignmentState): string {
  return `translate(${round4(state.offsetX * 100)}%, ${round4(state.offsetY * 100)}%) rotate(${state.rotationDeg}deg) scale(${state.scale})`;
}

export function toAlignmentInput(baseImageId: string, otherImageId: string, state: AlignmentState): AlignmentInput {
  return { baseImageId, otherImageId, ...clampAlignment(state) };
}
