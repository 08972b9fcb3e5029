import type { PrintSection } from '../section';
import { acquisitionPrints, deaccessions } from './acquisitions';
import { conditionReports } from './condition-reports';
import { displayPeriods, exhibitionObjects } from './displays';
import { images } from './images';
import { loanObjects } from './loans';
import { measurementSessions, measurementSpots } from './measurements';
import { movements } from './movements';
import { printOutcomes } from './outcomes';
import { processSteps } from './process-steps';
import { printSchedules, roundItems } from './schedule';
import { treatments } from './treatments';

/**
 * The sections of a print's file, in the order an import writes them: a table comes after the
 * tables it refers to (images before condition reports, whose observations name an image region;
 * reports before inspection rounds' items, which name the report that answered them).
 * Add a section: a file beside this one and a line here (DEVELOPERS.md "Preservation package").
 */
export const PRINT_SECTIONS: readonly PrintSection[] = [
  processSteps,
  images,
  conditionReports,
  treatments,
  measurementSessions,
  measurementSpots,
  movements,
  exhibitionObjects,
  displayPeriods,
  loanObjects,
  roundItems,
  printSchedules,
  printOutcomes,
  acquisitionPrints,
  deaccessions,
];
