import type { ScheduleVersion, StoredOpening } from '../../shared/schemas/schedule-upload.schema';

/**
 * An invented stored roof schedule for component tests, as the API answers it: version 3 of site 4's
 * schedule, typed in by Idris Venmore, with the faces and openings given. `version` changes any of the
 * version's own fields (its number, source, file name, date).
 */
export function scheduleFixture<F, O = StoredOpening>(faces: F[], openings: O[] = [], version: Partial<ScheduleVersion> = {}) {
  return {
    id: 12,
    project_id: 4,
    version: 3,
    source: 'form' as ScheduleVersion['source'],
    filename: null as string | null,
    face_count: faces.length,
    created_at: '2026-12-05T10:00:00.000Z',
    created_by: { id: 2, name: 'Idris Venmore' },
    ...version,
    faces,
    openings,
    warnings: [],
  };
}
