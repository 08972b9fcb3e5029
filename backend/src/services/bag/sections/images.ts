import type { PrintSection } from '../section';

/** Images before condition reports: an observation's region refers to an image. */
export const images: PrintSection = {
  key: 'images', table: 'images', parentColumn: 'print_id', orderBy: 't.captured_on NULLS LAST, t.uploaded_at, t.id',
  description: 'Photographs of the print. The original file is in the bag at data/images/<original_key>, byte for byte (its SHA-256 is the row\'s sha256); the display copies at data/images/<thumb_key> and <screen_key>.',
  children: [
    { key: 'fixityChecks', table: 'fixity_checks', parentColumn: 'image_id', orderBy: 't.id', description: 'Each check of the stored original against its SHA-256.' },
    { key: 'captureDateVoids', table: 'image_capture_date_voids', parentColumn: 'image_id', orderBy: 't.voided_at, t.id', description: 'A capture date set aside as wrong, with the reason (the image keeps it on record).' },
    { key: 'alignments', table: 'image_alignments', parentColumn: 'base_image_id', orderBy: 't.other_image_id', description: 'How another image of the print lines up with this one.' },
  ],
};
