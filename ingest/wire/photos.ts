/** Photos for the care log and trials (server/routes/photos.ts). */

/** What a photo can belong to; the care log and trials check the id against their tables. */
export const PHOTO_SUBJECT_KINDS = ['care_entry', 'trial_test'] as const;
export type PhotoSubjectKind = (typeof PHOTO_SUBJECT_KINDS)[number];

/**
 * One photo as the API answers it: in the 201 of an upload, and in the `photos` list of a care
 * entry or a trial test (oldest first). The URLs are the API's own (session-checked), never the
 * bucket's.
 */
export interface Photo {
  id: string;
  url: string;
  thumbUrl: string;
  widthPx: number;
  heightPx: number;
  /** Who added it (a member may delete their own); null when that account is gone. */
  addedById: string | null;
}

/** 201 of POST …/photos and of the care entry's and trial test's photo paths. */
export type CreatedPhoto = Photo;
