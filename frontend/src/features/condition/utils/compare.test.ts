import { describe, expect, it } from 'vitest';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { choosePair, orderWarning } from '@/features/condition/utils/compare';

const image = (id: string, viewType: string, capturedOn: string) =>
  ({ id, viewType, capturedOn, uploadedAt: `${capturedOn}T12:00:00.000Z` }) as unknown as PrintImage;
const recto95 = image('r95', 'recto', '1995-05-02');
const recto24 = image('r24', 'recto', '2024-03-11');
const raking01 = image('k01', 'raking_light', '2001-06-01');
const raking19 = image('k19', 'raking_light', '2019-09-09');
const all = [recto95, recto24, raking01, raking19];

describe('choosing images to compare', () => {
  it('warns when the earlier image was made after the later one', () => {
    expect(orderWarning(recto24, recto95)).toMatch(/2024-03-11.*after.*1995-05-02/);
    expect(orderWarning(recto95, recto24)).toBeNull();
  });

  it('choosing raking light as the earlier image moves the later side to raking light too', () => {
    expect(choosePair(all, 'a', 'k01', ['r95', 'r24'])).toEqual(['k01', 'k19']);
    // No later raking-light image after the chosen one: the latest other one of that view.
    expect(choosePair(all, 'a', 'k19', ['r95', 'r24'])).toEqual(['k19', 'k01']);
  });

  it('empties the later side when the chosen view has no other image', () => {
    const verso = image('v10', 'verso', '2010-01-01');
    expect(choosePair([...all, verso], 'a', 'v10', ['r95', 'r24'])).toEqual(['v10', '']);
  });

  it('leaves a pair of one view as chosen', () => {
    expect(choosePair(all, 'a', 'r24', ['r95', 'r24'])).toEqual(['r24', 'r95']);
    expect(choosePair(all, 'b', 'r95', ['r24', 'r24'])).toEqual(['r24', 'r95']);
  });
});
