import type { ClimateFile as ClimateFileDto, ClimateMapping } from '@toneledger/common/schemas/climate';
import type { ClimateFile } from '../models';

/** What the upload keeps of a file's head, so a list never reads the whole text again. */
export interface FileHead {
  columns: string[];
  sample: string[][];
  suggested: Partial<ClimateMapping>;
}

/** `climate_files.check_result` holds the head (from the upload) and the last check. */
export interface StoredCheck {
  head: FileHead;
  check: ClimateFileDto['check'];
}

export function presentClimateFile(f: ClimateFile, locationLabel: string, uploadedBy: { id: string; name: string }): ClimateFileDto {
  const stored = f.checkResult as unknown as StoredCheck | null;
  return {
    id: f.id,
    locationId: f.locationId,
    locationLabel,
    fileName: f.fileName,
    status: f.status,
    columns: stored?.head.columns ?? [],
    sample: stored?.head.sample ?? [],
    rowCount: f.rowCount,
    suggestedMapping: stored?.head.suggested ?? {},
    mapping: f.mapping,
    check: stored?.check ?? null,
    acceptedRows: f.acceptedRows,
    uploadedBy,
    uploadedAt: f.uploadedAt.toISOString(),
    acceptedAt: f.acceptedAt ? f.acceptedAt.toISOString() : null,
  };
}
