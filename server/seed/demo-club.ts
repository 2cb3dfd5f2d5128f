// The invented demo club. Every name, address and place here is made up.

export const DEMO_PASSWORD = 'stanceline-demo';
export const DEMO_CLUB_NAME = 'Larchwood Valley Ski Club';
export const DEMO_VENUE = 'Pinebrook Slope, Larchwood Valley';

/** Common practice in youth ski racing: "U12" means 10 and 11 in the season year. */
export const DEMO_AGE_GROUPS = [
  { name: 'U10', minAge: 8, maxAge: 9 },
  { name: 'U12', minAge: 10, maxAge: 11 },
  { name: 'U14', minAge: 12, maxAge: 13 },
  { name: 'U16', minAge: 14, maxAge: 15 },
] as const;

export type DemoGroupName = (typeof DEMO_AGE_GROUPS)[number]['name'];

export const DEMO_STAFF = [
  { key: 'head', email: 'head@larchwood.example', name: 'Ingrid Falkner', role: 'head_coach', groups: [] },
  {
    key: 'coach',
    email: 'coach@larchwood.example',
    name: 'Tomas Reinholt',
    role: 'coach',
    groups: ['U12', 'U14'],
  },
  {
    key: 'coach2',
    email: 'coach2@larchwood.example',
    name: 'Priya Castellan',
    role: 'coach',
    groups: ['U10', 'U16'],
  },
  { key: 'analyst', email: 'analyst@larchwood.example', name: 'Dev Amberley', role: 'analyst', groups: [] },
] as const satisfies readonly {
  key: string;
  email: string;
  name: string;
  role: 'head_coach' | 'coach' | 'analyst';
  groups: readonly DemoGroupName[];
}[];

export interface DemoAthlete {
  key: string;
  firstName: string;
  lastName: string;
  /** Age reached in the seed year; the birth year follows from it. */
  age: number;
  group: DemoGroupName;
  /** Guardian key (see DEMO_GUARDIANS); siblings share one. */
  guardian: string;
  consent: boolean;
  /** Consent covers reviews by e-mail too, unless false. */
  shareByEmail?: boolean;
  /** The athlete's own sign-in, if any. */
  email?: string;
}

export const DEMO_GUARDIANS = [
  { key: 'marrow', email: 'guardian@larchwood.example', name: 'Ruth Marrow', password: true },
  { key: 'ashby', email: 'l.ashby@larchwood.example', name: 'Leonie Ashby', password: false },
  { key: 'brenn', email: 'o.brenn@larchwood.example', name: 'Oskar Brenn', password: false },
  { key: 'caldor', email: 'm.caldor@larchwood.example', name: 'Mina Caldor', password: false },
  { key: 'dunmore', email: 'h.dunmore@larchwood.example', name: 'Hal Dunmore', password: false },
  { key: 'eskdale', email: 'j.eskdale@larchwood.example', name: 'Jo Eskdale', password: false },
  { key: 'fenwick', email: 'a.fenwick@larchwood.example', name: 'Ada Fenwick', password: false },
  { key: 'gorrie', email: 's.gorrie@larchwood.example', name: 'Sami Gorrie', password: false },
  { key: 'holt', email: 'c.holt@larchwood.example', name: 'Cass Holt', password: false },
  { key: 'ivers', email: 'r.ivers@larchwood.example', name: 'Rafe Ivers', password: false },
  { key: 'jessop', email: 'n.jessop@larchwood.example', name: 'Nell Jessop', password: false },
  { key: 'kettle', email: 'b.kettle@larchwood.example', name: 'Bram Kettle', password: false },
] as const;

export const DEMO_ATHLETES: DemoAthlete[] = [
  // The demo athlete sign-in: U14 with recorded consent; the demo guardian is parent of her and her brother.
  {
    key: 'elsie',
    firstName: 'Elsie',
    lastName: 'Marrow',
    age: 13,
    group: 'U14',
    guardian: 'marrow',
    consent: true,
    email: 'athlete@larchwood.example',
  },
  {
    key: 'finn',
    firstName: 'Finn',
    lastName: 'Marrow',
    age: 11,
    group: 'U12',
    guardian: 'marrow',
    consent: true,
  },
  {
    key: 'tilly',
    firstName: 'Tilly',
    lastName: 'Ashby',
    age: 9,
    group: 'U10',
    guardian: 'ashby',
    consent: true,
    shareByEmail: false,
  },
  {
    key: 'ruben',
    firstName: 'Ruben',
    lastName: 'Brenn',
    age: 8,
    group: 'U10',
    guardian: 'brenn',
    consent: true,
  },
  {
    key: 'iris',
    firstName: 'Iris',
    lastName: 'Caldor',
    age: 9,
    group: 'U10',
    guardian: 'caldor',
    consent: false,
  },
  {
    key: 'noor',
    firstName: 'Noor',
    lastName: 'Dunmore',
    age: 10,
    group: 'U12',
    guardian: 'dunmore',
    consent: false,
  },
  {
    key: 'arlo',
    firstName: 'Arlo',
    lastName: 'Eskdale',
    age: 11,
    group: 'U12',
    guardian: 'eskdale',
    consent: true,
  },
  {
    key: 'wren',
    firstName: 'Wren',
    lastName: 'Fenwick',
    age: 10,
    group: 'U12',
    guardian: 'fenwick',
    consent: true,
  },
  {
    key: 'kit',
    firstName: 'Kit',
    lastName: 'Gorrie',
    age: 12,
    group: 'U14',
    guardian: 'gorrie',
    consent: true,
  },
  {
    key: 'maya',
    firstName: 'Maya',
    lastName: 'Holt',
    age: 13,
    group: 'U14',
    guardian: 'holt',
    consent: true,
  },
  {
    key: 'ezra',
    firstName: 'Ezra',
    lastName: 'Holt',
    age: 12,
    group: 'U14',
    guardian: 'holt',
    consent: false,
  },
  {
    key: 'signe',
    firstName: 'Signe',
    lastName: 'Ivers',
    age: 15,
    group: 'U16',
    guardian: 'ivers',
    consent: true,
  },
  {
    key: 'lev',
    firstName: 'Lev',
    lastName: 'Jessop',
    age: 14,
    group: 'U16',
    guardian: 'jessop',
    consent: true,
  },
  {
    key: 'cora',
    firstName: 'Cora',
    lastName: 'Kettle',
    age: 15,
    group: 'U16',
    guardian: 'kettle',
    consent: false,
  },
];

/** Two invented training days, placed this many days before the seed date. */
export const DEMO_SESSIONS = [
  {
    daysAgo: 9,
    discipline: 'giant_slalom',
    snow: 'packed',
    notes: 'Open GS set, 24 gates. Baseline clips for the U12 and U14 groups.',
  },
  {
    daysAgo: 2,
    discipline: 'free_ski',
    snow: 'soft',
    notes: 'Stance and knee-separation drills on the lower pitch, then free skiing.',
  },
] as const;

export const DEMO_SIGN_INS = [
  'head@larchwood.example',
  'coach@larchwood.example',
  'analyst@larchwood.example',
  'athlete@larchwood.example',
  'guardian@larchwood.example',
];
