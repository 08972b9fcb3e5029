import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import type { Region } from '@toneledger/common/schemas/condition';
import { RegionDrawer } from '@/features/condition/components/region-drawer';
import { IMAGE_NEW, IMAGE_OLD, images } from '@/features/condition/testing/fixtures';
import { addPolygonPoint, rectFromDrag, toNormalised } from '@/features/condition/utils/region';

/** The drawing surface, laid out as a 400 × 200 image whose top-left corner is at (100, 50) on screen. */
function surface() {
  const element = screen.getByRole('application', { name: 'Draw on the image' });
  vi.spyOn(element, 'getBoundingClientRect').mockReturnValue({ left: 100, top: 50, width: 400, height: 200, right: 500, bottom: 250, x: 100, y: 50, toJSON: () => ({}) } as DOMRect);
  return element;
}

function renderDrawer(initial: Region | null = null) {
  const onSave = vi.fn<(region: Region) => void>();
  const onCancel = vi.fn();
  render(<RegionDrawer images={images} initial={initial} suggestedImageId={IMAGE_NEW} onSave={onSave} onCancel={onCancel} />);
  return { onSave, onCancel };
}

describe('region geometry', () => {
  it('normalises a pointer position to the image and keeps it inside', () => {
    const box = { left: 100, top: 50, width: 400, height: 200 };
    expect(toNormalised(200, 100, box)).toEqual([0.25, 0.25]);
    expect(toNormalised(50, 400, box)).toEqual([0, 1]);
  });

  it('orders the corners of a drag whichever way it went, and skips a repeated polygon point', () => {
    expect(rectFromDrag([0.8, 0.9], [0.2, 0.1])).toEqual([[0.2, 0.1], [0.8, 0.9]]);
    const once = addPolygonPoint([[0.1, 0.1]], [0.5, 0.5]);
    expect(addPolygonPoint(once, [0.5, 0.5])).toBe(once);
  });
});

describe('RegionDrawer', () => {
  it('makes a rectangle from a drag, in fractions of the image', () => {
    const { onSave } = renderDrawer();
    expect((screen.getByLabelText('Image') as HTMLSelectElement).value).toBe(IMAGE_NEW);
    const draw = surface();
    // Dragged up and to the left: the corners still come out top-left, bottom-right.
    fireEvent.pointerDown(draw, { clientX: 400, clientY: 200, button: 0, pointerId: 1 });
    fireEvent.pointerMove(draw, { clientX: 300, clientY: 120, pointerId: 1 });
    fireEvent.pointerUp(draw, { clientX: 200, clientY: 100, button: 0, pointerId: 1 });
    expect((screen.getByLabelText('Corner 1 x') as HTMLInputElement).value).toBe('0.25');
    fireEvent.click(screen.getByRole('button', { name: 'Use this region' }));
    expect(onSave).toHaveBeenCalledWith({ imageId: IMAGE_NEW, shape: 'rect', points: [[0.25, 0.25], [0.75, 0.75]] });
  });

  it('makes a polygon from clicks, closed by a double-click', () => {
    const { onSave } = renderDrawer();
    fireEvent.click(screen.getByLabelText('Polygon'));
    const draw = surface();
    fireEvent.click(draw, { clientX: 100, clientY: 50 });
    fireEvent.click(draw, { clientX: 500, clientY: 50 });
    fireEvent.click(draw, { clientX: 300, clientY: 250 });
    // A double-click sends two more clicks at the same place first; they add no points.
    fireEvent.click(draw, { clientX: 300, clientY: 250 });
    fireEvent.doubleClick(draw, { clientX: 300, clientY: 250 });
    expect(screen.getByText('Polygon closed with 3 points.')).toBeTruthy();
    // Clicks after closing do not add points.
    fireEvent.click(draw, { clientX: 200, clientY: 60 });
    fireEvent.click(screen.getByRole('button', { name: 'Use this region' }));
    expect(onSave).toHaveBeenCalledWith({ imageId: IMAGE_NEW, shape: 'polygon', points: [[0, 0], [1, 0], [0.5, 1]] });
  });

  it('closes a polygon with Enter and cancels the shape being drawn with Escape', () => {
    const { onSave, onCancel } = renderDrawer();
    fireEvent.click(screen.getByLabelText('Polygon'));
    const draw = surface();
    fireEvent.click(draw, { clientX: 100, clientY: 50 });
    fireEvent.click(draw, { clientX: 500, clientY: 50 });
    fireEvent.keyDown(draw, { key: 'Escape' });
    expect(screen.getByText('No points yet.')).toBeTruthy();
    expect(onCancel).not.toHaveBeenCalled();

    fireEvent.click(draw, { clientX: 100, clientY: 50 });
    fireEvent.click(draw, { clientX: 500, clientY: 50 });
    fireEvent.click(draw, { clientX: 500, clientY: 250 });
    fireEvent.click(draw, { clientX: 100, clientY: 250 });
    fireEvent.keyDown(draw, { key: 'Enter' });
    expect(screen.getByText('Polygon closed with 4 points.')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Use this region' }));
    expect(onSave.mock.calls[0]?.[0].points).toEqual([[0, 0], [1, 0], [1, 1], [0, 1]]);

    // With nothing being drawn, Escape leaves the drawer.
    fireEvent.keyDown(draw, { key: 'Escape' });
    expect(onCancel).toHaveBeenCalled();
  });

  it('takes the points from the keyboard instead of a pointer, and refuses a rectangle with no size', () => {
    const { onSave } = renderDrawer({ imageId: IMAGE_OLD, shape: 'rect', points: [[0.1, 0.1], [0.2, 0.2]] });
    expect((screen.getByLabelText('Image') as HTMLSelectElement).value).toBe(IMAGE_OLD);
    fireEvent.change(screen.getByLabelText('Corner 2 x'), { target: { value: '0.1' } });
    fireEvent.click(screen.getByRole('button', { name: 'Use this region' }));
    expect(screen.getByRole('alert').textContent).toMatch(/no size/);
    expect(onSave).not.toHaveBeenCalled();

    fireEvent.change(screen.getByLabelText('Corner 2 x'), { target: { value: '0.65' } });
    fireEvent.change(screen.getByLabelText('Corner 2 y'), { target: { value: '0.4' } });
    fireEvent.click(screen.getByRole('button', { name: 'Use this region' }));
    expect(onSave).toHaveBeenCalledWith({ imageId: IMAGE_OLD, shape: 'rect', points: [[0.1, 0.1], [0.65, 0.4]] });
  });

  it('builds a polygon from typed points only', () => {
    const { onSave } = renderDrawer();
    fireEvent.click(screen.getByLabelText('Polygon'));
    fireEvent.click(screen.getByRole('button', { name: 'Add point' }));
    fireEvent.click(screen.getByRole('button', { name: 'Add point' }));
    fireEvent.click(screen.getByRole('button', { name: 'Use this region' }));
    expect(screen.getByRole('alert').textContent).toMatch(/at least three points/);
    fireEvent.click(screen.getByRole('button', { name: 'Add point' }));
    fireEvent.change(screen.getByLabelText('Point 1 x'), { target: { value: '0.2' } });
    fireEvent.change(screen.getByLabelText('Point 2 y'), { target: { value: '0.9' } });
    fireEvent.click(screen.getByRole('button', { name: 'Use this region' }));
    expect(onSave).toHaveBeenCalledWith({ imageId: IMAGE_NEW, shape: 'polygon', points: [[0.2, 0.5], [0.5, 0.9], [0.5, 0.5]] });
  });
});
