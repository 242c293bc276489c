/** Photos for the care log and trials (server/routes/photos.ts). */

/** What a photo can belong to; the care log and trials check the id against their tables. */
export const PHOTO_SUBJECT_KINDS = ['care_entry', 'trial_test'] as const;
export type PhotoSubjectKind = (typeof PHOTO_SUBJECT_KINDS)[number];

/** 201 of POST /shops/:shopId/photos. The URLs are the API's own (session-checked), never the bucket's. */
export interface CreatedPhoto {
  id: string;
  url: string;
  thumbUrl: string;
  widthPx: number;
  heightPx: number;
}
