// The photo record kind (issue 25): a photo of the gauge, the control, a section or a site. Plain data;
// the image bytes are kept apart and named by their SHA-256.

/** Media types a stored photo may have: the one list. */
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;
/** The media type of stored photo bytes. */
export type PhotoType = (typeof PHOTO_TYPES)[number];
/** Kinds of record a photo may belong to (a logger import's check readings are readings): the one list. */
export const PHOTO_OWNER_KINDS = ['reading', 'gauging', 'site'] as const;
/** The kind of record a photo belongs to. */
export type PhotoOwnerKind = (typeof PHOTO_OWNER_KINDS)[number];
/** Largest photo (stored or kept original) a record may describe, bytes: 16 MiB, the receiver's stated limit. */
export const MAX_PHOTO_BYTES = 16_777_216;
/** Largest width or height of a stored photo, px. */
export const MAX_PHOTO_PX = 20_000;
/** Longest photo caption, characters. */
export const MAX_CAPTION_LENGTH = 500;

/** Bytes kept apart from the record, named by their SHA-256 (64 lower-case hex digits). */
export interface PhotoBytesRef {
  sha256: string;
  bytes: number;
  type: PhotoType;
}

/**
 * A photo of the gauge, the control, a section or a site, kept as a record of its own that refers to its
 * owner. The image itself travels apart, content-addressed by `sha256` (the resized bytes); `original`
 * names the untouched file when the user chose to keep it.
 */
export interface PhotoBody extends PhotoBytesRef {
  /** The site the owner belongs to (for a site photo, the site itself). */
  siteId: string;
  owner: { kind: PhotoOwnerKind; id: string };
  width_px: number;
  height_px: number;
  /** When the photo was taken (the file's time if known, else when chosen), UTC ms. */
  taken_ms: number;
  caption?: string;
  original?: PhotoBytesRef;
}
