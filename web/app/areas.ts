// The areas of the app, in bottom-bar order: the one list the router and the bottom bar both read.

/** The areas: id (the first path segment), the bottom-bar label and the page title. */
export const AREAS = [
  { id: 'sites', label: 'Sites', title: 'Sites' },
  { id: 'record', label: 'Record', title: 'Record a reading' },
  { id: 'storm', label: 'Storm', title: 'Storm runoff' },
  { id: 'data', label: 'Data', title: 'Data and sync' },
  { id: 'about', label: 'About', title: 'About' },
] as const;

/** One area's id. */
export type AreaId = (typeof AREAS)[number]['id'];

/** The area with this id. */
export function areaOf(id: AreaId): (typeof AREAS)[number] {
  return AREAS.find((a) => a.id === id)!;
}
