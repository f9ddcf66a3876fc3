/** The home page: what waits for the signed-in person, one section per kind of work their roles bring. */

/** Instruments are listed this many days before their calibration falls due (and once overdue). */
export const INSTRUMENT_DUE_SOON_DAYS = 30;
/** How many items each section shows; its count covers them all. */
export const HOME_ITEMS_SHOWN = 5;

export const HOME_SECTIONS = [
  'runs',
  'witness',
  'decisions',
  'acknowledgements',
  'reviews',
  'drafts',
  'reviewDue',
  'instruments',
  'followUps',
  'releases',
] as const;
export type HomeSectionKey = (typeof HOME_SECTIONS)[number];

export interface HomeItem {
  id: string;
  label: string;
  detail: string;
  href: string;
  /** Needs attention first (overdue, returned, on hold). */
  urgent: boolean;
}

export interface HomeSection {
  key: HomeSectionKey;
  title: string;
  /** Where the whole list lives. */
  href: string;
  linkLabel: string;
  count: number;
  items: HomeItem[];
}

export interface HomeView {
  sections: HomeSection[];
}
