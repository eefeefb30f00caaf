/**
 * The demo export of "Quillfern Community Care", an INVENTED home-care provider.
 * Every name, e-mail address, phone number, team and figure produced here is invented by a seeded
 * generator; any resemblance to real people or organisations is accidental.
 */
import type { DatasetMapping } from '../../../shared/datasets';

export const QUILLFERN_NOTE =
  'Note: "Quillfern Community Care" is an invented organisation. All names, e-mail addresses, phone numbers, teams and figures in this export are invented by a seeded generator for demonstrations of Coppice.';

export const QUILLFERN_WINDOW = { start: '2025-10-01', end: '2026-09-30' } as const;
export const DEMO_MANAGER_NORTH = 'manager.north@quillfern.example';
export const DEMO_MANAGER_SOUTH = 'manager.south@quillfern.example';

export const QUILLFERN_COLUMNS = [
  'Staff No',
  'Full Name',
  'Personal Email',
  'Phone',
  'Date of Birth',
  'Sex',
  'Ethnicity',
  'Disability',
  'Marital Status',
  'Region',
  'Depot',
  'Crew',
  'Line Manager Email',
  'Role',
  'Pay Band',
  'Contract',
  'Start Date',
  'Leaving Date',
  'Leaving Reason',
  'Weekly Overtime Hours',
  'Avg Travel Minutes Between Visits',
  'Weekend Shifts per Month',
  'Months Since Pay Rise',
  'Training Days',
  'Engagement Score',
  'Absence Days',
  'Years Since Qualification',
] as const;
export type QuillfernColumn = (typeof QUILLFERN_COLUMNS)[number];
export type QuillfernValue = string | number | null;
export type QuillfernExport = {
  header: QuillfernColumn[];
  rows: QuillfernValue[][];
  dateColumns: QuillfernColumn[];
};

/** The mapping body (API.md) for this export, used for seeding and in tests. */
export const QUILLFERN_MAPPING: DatasetMapping = {
  employeeId: 'Staff No',
  team: 'Crew',
  department: 'Depot',
  managerEmail: 'Line Manager Email',
  outcome: {
    kind: 'exit-dates',
    startDate: 'Start Date',
    exitDate: 'Leaving Date',
    exitReason: 'Leaving Reason',
    voluntaryReasons: ['Resignation'],
    windowStart: QUILLFERN_WINDOW.start,
    windowEnd: QUILLFERN_WINDOW.end,
  },
  excluded: [],
};

/** mulberry32: a small, well-known 32-bit generator; enough for demo data, not for secrets. */
export function createRandom(seed: number) {
  let state = seed >>> 0;
  const next = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (mean = 0, sd = 1) => {
    const u = Math.max(next(), 1e-12);
    return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * next());
  };
  const pick = <T>(items: readonly T[]): T => items[Math.floor(next() * items.length)];
  const weighted = <T>(items: readonly (readonly [T, number])[]): T => {
    const total = items.reduce((sum, [, w]) => sum + w, 0);
    let r = next() * total;
    for (const [item, w] of items) {
      r -= w;
      if (r < 0) return item;
    }
    return items[items.length - 1][0];
  };
  return { next, normal, pick, weighted, chance: (p: number) => next() < p };
}
type Random = ReturnType<typeof createRandom>;

const REGIONS: { region: string; depots: { name: string; rural: number }[] }[] = [
  {
    region: 'North',
    depots: [
      { name: 'Alderbrook', rural: 0.8 },
      { name: 'Harrowfield', rural: 0.3 },
      { name: 'Kestrel Moor', rural: 1 },
    ],
  },
  {
    region: 'South',
    depots: [
      { name: 'Bramblecote', rural: 0.5 },
      { name: 'Saltmere', rural: 0.2 },
      { name: 'Wrenford', rural: 0.7 },
    ],
  },
  {
    region: 'East',
    depots: [
      { name: 'Fenwick End', rural: 0.9 },
      { name: 'Marshgate', rural: 0.4 },
    ],
  },
  {
    region: 'West',
    depots: [
      { name: 'Copperhill', rural: 0.6 },
      { name: 'Tollbridge', rural: 0.3 },
    ],
  },
  {
    region: 'Central',
    depots: [
      { name: 'Millward', rural: 0.1 },
      { name: 'Oakhurst', rural: 0.2 },
    ],
  },
];

const FIRST_NAMES = [
  'Amara',
  'Bethan',
  'Callum',
  'Delyth',
  'Eitan',
  'Farah',
  'Gethin',
  'Hollis',
  'Ines',
  'Jory',
  'Kezia',
  'Lowen',
  'Marisol',
  'Niamh',
  'Oren',
  'Priya',
  'Quinn',
  'Rhiannon',
  'Soren',
  'Tamsin',
  'Ulla',
  'Veda',
  'Wynn',
  'Yara',
  'Zadie',
  'Anwen',
  'Bryn',
  'Cerys',
  'Dario',
  'Elowen',
  'Fintan',
  'Greer',
  'Hana',
  'Idris',
  'Juno',
  'Kofi',
];
const LAST_NAMES = [
  'Ashgrove',
  'Birchall',
  'Coldwell',
  'Dunmore',
  'Elsworth',
  'Fallowby',
  'Greywood',
  'Hartwell',
  'Ingleby',
  'Jessop',
  'Kilbride',
  'Larkfield',
  'Merriman',
  'Northcott',
  'Oakley',
  'Penhallow',
  'Quarrie',
  'Redfern',
  'Stanwick',
  'Thistlewood',
  'Underhay',
  'Vellacott',
  'Whitlow',
  'Yarrow',
  'Brackenbury',
  'Cawthorne',
];

const ROLES = [
  ['Carer', 60],
  ['Senior Carer', 12],
  ['Nurse', 8],
  ['Scheduler', 6],
  ['Driver', 7],
  ['Office Administrator', 7],
] as const;
type Role = (typeof ROLES)[number][0];
const VISITING: Role[] = ['Carer', 'Senior Carer', 'Nurse'];
const PAY_BAND: Record<Role, [number, number]> = {
  Carer: [1, 2],
  'Senior Carer': [2, 3],
  Nurse: [4, 5],
  Scheduler: [2, 3],
  Driver: [1, 2],
  'Office Administrator': [2, 4],
};

type Crew = { region: string; depot: string; rural: number; name: string; manager: string; size: number };

function buildCrews(rows: number, random: Random): Crew[] {
  const depots = REGIONS.flatMap((r) =>
    r.depots.map((d) => ({ region: r.region, depot: d.name, rural: d.rural })),
  );
  // Fixed demo crews first: manager.north runs three crews in North (one of only 3 people),
  // manager.south two in South; one more small crew elsewhere.
  const fixed: Crew[] = [
    { ...depots[0], name: 'Alderbrook Crew 1', manager: DEMO_MANAGER_NORTH, size: 0 },
    { ...depots[0], name: 'Alderbrook Crew 2', manager: DEMO_MANAGER_NORTH, size: 0 },
    { ...depots[1], name: 'Harrowfield Night Crew', manager: DEMO_MANAGER_NORTH, size: 3 },
    { ...depots[3], name: 'Bramblecote Crew 1', manager: DEMO_MANAGER_SOUTH, size: 0 },
    { ...depots[4], name: 'Saltmere Crew 1', manager: DEMO_MANAGER_SOUTH, size: 0 },
    { ...depots[7], name: 'Marshgate Relief Crew', manager: 'r.penhallow@quillfern.example', size: 4 },
  ];
  const others = Math.max(4, Math.round(rows / 17) - fixed.length);
  const crews = [...fixed];
  for (let i = 0; i < others; i += 1) {
    const depot = depots[i % depots.length];
    const number =
      Math.floor(i / depots.length) + ({ Alderbrook: 3, Bramblecote: 2, Saltmere: 2 }[depot.depot] ?? 1);
    const manager = `${random.pick(FIRST_NAMES).toLowerCase()}.${random.pick(LAST_NAMES).toLowerCase()}@quillfern.example`;
    crews.push({ ...depot, name: `${depot.depot} Crew ${number}`, manager, size: 0 });
  }
  return crews;
}

function isoFromUtc(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

function addDays(iso: string, days: number): string {
  return isoFromUtc(Date.parse(iso) + Math.round(days) * 86_400_000);
}

function clamp(value: number, low: number, high: number): number {
  return Math.min(high, Math.max(low, value));
}

function round1(value: number): number {
  return Math.round(value * 10) / 10;
}

/**
 * Generates the invented export: one row per person active at some point in the observation
 * window (plus a few rows outside it, as real exports have), with realistic drivers of resignation.
 */
export function generateQuillfernExport(options: { rows?: number; seed?: number } = {}): QuillfernExport {
  const rows = Math.max(20, Math.floor(options.rows ?? 2400));
  const random = createRandom(options.seed ?? 20251001);
  const crews = buildCrews(rows, random);
  const flexible = crews.filter((crew) => crew.size === 0);
  const fixedSize = crews.reduce((sum, crew) => sum + crew.size, 0);

  const assignments: Crew[] = [];
  for (const crew of crews) for (let i = 0; i < crew.size; i += 1) assignments.push(crew);
  for (let i = 0; i < rows - fixedSize; i += 1) assignments.push(flexible[i % flexible.length]);

  const windowStart = QUILLFERN_WINDOW.start;
  const windowEnd = QUILLFERN_WINDOW.end;
  const windowDays = (Date.parse(windowEnd) - Date.parse(windowStart)) / 86_400_000;
  const out: QuillfernValue[][] = [];

  assignments.forEach((crew, i) => {
    const first = random.pick(FIRST_NAMES);
    const last = random.pick(LAST_NAMES);
    const role = random.weighted(ROLES);
    const visiting = VISITING.includes(role);
    const age = clamp(Math.round(random.normal(41, 12)), 18, 67);
    const birth = addDays(windowStart, -age * 365.25 - random.next() * 365);
    const sex = random.weighted([
      ['Female', 77],
      ['Male', 21],
      ['Prefer not to say', 2],
    ] as const);
    const ethnicity = random.weighted([
      ['White British', 62],
      ['White Other', 10],
      ['Asian or Asian British', 11],
      ['Black or Black British', 10],
      ['Mixed', 4],
      ['Prefer not to say', 3],
    ] as const);
    const disability = random.weighted([
      ['No', 86],
      ['Yes', 9],
      ['Prefer not to say', 5],
    ] as const);
    const marital = random.weighted([
      ['Single', 38],
      ['Married', 40],
      ['Civil Partnership', 4],
      ['Divorced', 12],
      ['Widowed', 3],
      ['Prefer not to say', 3],
    ] as const);

    // Tenure at the window start, in years: many recent starters, a long tail.
    const tenureYears = random.chance(0.12)
      ? -random.next() * 0.95
      : Math.min(-Math.log(1 - random.next()) * 4.2, age - 17);
    let start = addDays(windowStart, -tenureYears * 365.25);
    if (random.chance(0.004)) start = addDays(windowEnd, 10 + random.next() * 60); // starts after the window
    const partTime = random.chance(visiting ? 0.38 : 0.2);
    const rural = crew.rural;

    const travel = visiting ? round1(clamp(random.normal(14 + 18 * rural, 6), 3, 60)) : null;
    const weekends =
      role === 'Office Administrator' ? 0 : Math.round(clamp(random.normal(visiting ? 4 : 2, 2), 0, 8));
    const overtime = round1(clamp(random.normal(partTime ? 2 : 5, 3.5), 0, 22));
    const sincePayRise = Math.round(clamp(random.normal(13, 8), 0, 40));
    const training = Math.round(clamp(random.normal(visiting ? 4 : 2.5, 2), 0, 12));
    const engagementBase =
      3.6 - 0.04 * (weekends - 3) - 0.02 * (overtime - 5) + 0.08 * (training - 3) + random.normal(0, 0.6);
    const engagement = round1(clamp(engagementBase, 1, 5));
    const absence = Math.round(clamp(-Math.log(1 - random.next()) * (4 + 0.15 * overtime), 0, 60));
    // The planted proxy: years since qualification follows age closely.
    const qualification = Math.round(clamp(age - 19 - random.next() * 5 + random.normal(0, 1.5), 0, 50));

    const tenureMonths = Math.max(0, tenureYears * 12);
    // Realistic drivers of resignation (invented weights): travel time between visits, weekend shifts,
    // overtime, time since the last pay rise, short tenure, low engagement, few training days.
    const logit =
      -3.6 +
      (travel === null ? 0 : 0.03 * (travel - 20) + (travel > 32 ? 1.3 : 0)) +
      0.15 * (weekends - 3) +
      (weekends >= 6 ? 1.1 : 0) +
      0.05 * (overtime - 5) +
      (overtime > 10 ? 1.0 : 0) +
      0.03 * (sincePayRise - 13) +
      (sincePayRise > 22 ? 1.1 : 0) -
      0.45 * (engagement - 3.5) +
      (engagement < 2.8 ? 1.2 : 0) -
      0.12 * (training - 3) +
      (tenureMonths < 12 ? 1.2 : tenureMonths < 24 ? 0.5 : 0) +
      (age < 25 ? 0.25 : 0);
    const resign = random.chance(1 / (1 + Math.exp(-logit)));

    let leaving: string | null = null;
    let reason: string | null = null;
    if (resign) {
      reason = 'Resignation';
    } else if (age >= 60 && random.chance(0.18)) {
      reason = 'Retirement';
    } else if (random.chance(0.025)) {
      reason = random.weighted([
        ['Dismissal', 45],
        ['End of contract', 35],
        ['Redundancy', 10],
        ['Ill health', 10],
      ] as const);
    }
    if (reason) leaving = addDays(windowStart, random.next() * windowDays);
    if (!reason && random.chance(0.004)) {
      leaving = addDays(windowStart, -10 - random.next() * 200); // left before the window began
      reason = 'Resignation';
    }
    if (leaving !== null && leaving < start) leaving = addDays(start, 20 + random.next() * 60);
    if (leaving !== null && leaving > windowEnd) {
      leaving = null;
      reason = null;
    }

    const [lowBand, highBand] = PAY_BAND[role];
    const band = `B${lowBand + Math.floor(random.next() * (highBand - lowBand + 1))}`;
    out.push([
      `QF${String(104_000 + i * 7).padStart(6, '0')}`,
      `${first} ${last}`,
      `${first}.${last}${i % 97}@mailbox.example`.toLowerCase(),
      `07700 900${String(i % 1000).padStart(3, '0')}`,
      birth,
      sex,
      ethnicity,
      disability,
      marital,
      crew.region,
      crew.depot,
      crew.name,
      crew.manager,
      role,
      band,
      partTime ? 'Part time' : 'Full time',
      start,
      leaving,
      reason,
      random.chance(0.03) ? null : overtime,
      travel,
      weekends,
      random.chance(0.02) ? null : sincePayRise,
      training,
      random.chance(0.12) ? null : engagement,
      absence,
      random.chance(0.05) ? null : qualification,
    ]);
  });

  return {
    header: [...QUILLFERN_COLUMNS],
    rows: out,
    dateColumns: ['Date of Birth', 'Start Date', 'Leaving Date'],
  };
}
