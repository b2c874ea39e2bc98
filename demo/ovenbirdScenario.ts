import seedrandom from "seedrandom";

/**
 * The demo scenario: "Ovenbird Bakery" (our invention) delivers bread at dawn around York
 * (North Yorkshire, UK). Business names, streets and people are invented; the town,
 * its rough coordinates and the villages' positions are real. Phone numbers sit in
 * Ofcom's range reserved for drama (01632 960000-960999, from memory) so none rings anyone.
 */

/** One stop row of the demo, in the units of the sheet (times as minutes from midnight). */
export interface DemoStop {
  readonly id: string;
  readonly name: string;
  readonly address: string;
  readonly lat: number;
  readonly lon: number;
  readonly demandKg: number;
  readonly crates: number;
  /** One or two windows for the start of service, minutes from midnight. */
  readonly windows: readonly (readonly [number, number])[];
  readonly serviceMin: number;
  /** Cost of leaving the stop unserved; undefined = must be served. */
  readonly priority?: number;
  readonly phone: string;
}

/** One van of the demo fleet. */
export interface DemoVehicle {
  readonly id: string;
  readonly capacityKg: number;
  readonly capacityCrates: number;
  readonly start: readonly [number, number];
  readonly end: readonly [number, number];
  readonly shiftStartMin: number;
  readonly shiftEndMin: number;
  readonly fixedCost: number;
  readonly costPerKm: number;
  readonly costPerHour: number;
  readonly speedKmh: number;
  readonly maxStops?: number;
}

/** The bakery's main depot (an industrial estate north of the centre) and a second one in Tadcaster. */
export const BAKERY_DEPOT: readonly [number, number] = [53.9885, -1.1005];
export const TADCASTER_DEPOT: readonly [number, number] = [53.8842, -1.2618];
const YORK_CENTRE: readonly [number, number] = [53.9596, -1.0815];
/** Villages around York (approximate real positions) where a few stops sit. */
const VILLAGES: readonly (readonly [string, number, number])[] = [
  ["Haxby", 54.0163, -1.0745],
  ["Strensall", 54.0405, -1.0337],
  ["Copmanthorpe", 53.9137, -1.142],
  ["Stamford Bridge", 53.9903, -0.9132],
  ["Elvington", 53.9236, -0.9315],
  ["Bishopthorpe", 53.9213, -1.096],
];

const KINDS = [
  { kind: "Café", kg: [8, 22], window: [360, 480], service: [4, 8], weight: 30 },
  { kind: "Corner Shop", kg: [15, 40], window: [420, 630], service: [5, 9], weight: 25 },
  { kind: "Deli", kg: [10, 28], window: [390, 540], service: [5, 8], weight: 12 },
  { kind: "Tearoom", kg: [6, 16], window: [420, 600], service: [4, 7], weight: 10 },
  { kind: "Guest House", kg: [10, 24], window: [330, 420], service: [4, 6], weight: 8 },
  { kind: "Hotel", kg: [30, 60], window: [345, 450], service: [8, 12], weight: 5 },
] as const;

const FIRST = [
  "Larkspur",
  "Millstone",
  "Wrenfield",
  "Tallow",
  "Quernstone",
  "Hollin",
  "Briar",
  "Kestrel",
  "Oriel",
  "Pennyroyal",
  "Saltbox",
  "Thimble",
  "Marigold",
  "Foxglove",
  "Bramble",
  "Cobnut",
  "Lantern",
  "Linnet",
  "Sorrel",
  "Juniper",
  "Meadowsweet",
  "Tansy",
  "Damson",
  "Heron",
  "Plover",
];
const SECOND = ["Yard", "Lane", "Gate", "Row", "Corner", "Green", "Bridge", "Court", "Mill", "Cross"];
const STREETS = [
  "Wrenfield Road",
  "Tallow Street",
  "Quernstone Way",
  "Hollin Lane",
  "Briar Close",
  "Kestrel Walk",
  "Oriel Terrace",
  "Saltbox Row",
  "Thimble Court",
  "Cobnut Avenue",
  "Linnet Grove",
];

/**
 * Generate the demo stops and fleet from a seed (seedrandom), so the workbook is reproducible.
 *
 * @param seed - seed of the generator (the committed workbook uses "ovenbird-1")
 * @param count - number of stops, 60..120 (default 84)
 * @returns stops and vans of the Ovenbird Bakery dawn round
 * @throws RangeError when count is outside 60..120
 * @example ovenbirdScenario().stops.length // => 84
 */
export function ovenbirdScenario(seed = "ovenbird-1", count = 84): { stops: DemoStop[]; fleet: DemoVehicle[] } {
  if (!Number.isInteger(count) || count < 60 || count > 120) throw new RangeError(`count must be an integer in 60..120, got ${count}`);
  const rng = seedrandom(seed);
  const int = (lo: number, hi: number): number => lo + Math.floor(rng() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rng() * xs.length)]!;
  const usedNames = new Set<string>();
  const name = (kind: string): string => {
    for (;;) {
      const n = `${pick(FIRST)} ${pick(SECOND)} ${kind}`;
      if (!usedNames.has(n)) {
        usedNames.add(n);
        return n;
      }
    }
  };
  const phones = new Set<number>();
  const phone = (): string => {
    let n = int(100, 999);
    while (phones.has(n)) n = int(100, 999);
    phones.add(n);
    return `01632 960${n}`;
  };

  const stops: DemoStop[] = [];
  const add = (s: Omit<DemoStop, "id" | "phone" | "crates"> & { crates?: number }): void => {
    stops.push({
      ...s,
      id: `S${String(stops.length + 1).padStart(3, "0")}`,
      crates: s.crates ?? Math.ceil(s.demandKg / 6),
      phone: phone(),
    });
  };
  const where = (): { lat: number; lon: number; area: string } => {
    // A fifth of the stops in the villages, the rest within 6 km of the centre.
    if (rng() < 0.2) {
      const [area, lat, lon] = pick(VILLAGES);
      return { area, ...offset(lat, lon, 1.2 * Math.sqrt(rng()), rng() * 2 * Math.PI) };
    }
    return { area: "York", ...offset(YORK_CENTRE[0], YORK_CENTRE[1], 6 * Math.sqrt(rng()), rng() * 2 * Math.PI) };
  };
  const address = (area: string): string => `${int(1, 180)} ${pick(STREETS)}, ${area}`;

  // The fixed cast: a school, a hospital kitchen with two drops, a care home with two windows.
  const school = where();
  add({
    name: "St Wendreda's Primary School",
    address: address(school.area),
    lat: school.lat,
    lon: school.lon,
    demandKg: 35,
    windows: [[450, 510]],
    serviceMin: 10,
  });
  const hospital = offset(YORK_CENTRE[0], YORK_CENTRE[1], 1.6, 0.4);
  add({
    name: "Riverside General Hospital Kitchen",
    address: "Loading bay 3, Wrenfield Road, York",
    ...hospital,
    demandKg: 90,
    crates: 16,
    windows: [
      [330, 390],
      [540, 585],
    ],
    serviceMin: 15,
  });
  const care = where();
  add({
    name: "Hollybank Care Home",
    address: address(care.area),
    lat: care.lat,
    lon: care.lon,
    demandKg: 25,
    windows: [
      [390, 450],
      [600, 660],
    ],
    serviceMin: 8,
  });
  const market = where();
  add({
    name: "Saturday Market Stall 12",
    address: address(market.area),
    lat: market.lat,
    lon: market.lon,
    demandKg: 40,
    windows: [
      [360, 420],
      [480, 510],
    ],
    serviceMin: 6,
  });

  const totalWeight = KINDS.reduce((s, k) => s + k.weight, 0);
  while (stops.length < count) {
    let w = rng() * totalWeight;
    const k = KINDS.find((kk) => (w -= kk.weight) < 0) ?? KINDS[0];
    const p = where();
    const from = k.window[0] + 15 * int(-1, 1);
    add({
      name: name(k.kind),
      address: address(p.area),
      lat: p.lat,
      lon: p.lon,
      demandKg: int(k.kg[0], k.kg[1]),
      windows: [[from, k.window[1]]],
      serviceMin: int(k.service[0], k.service[1]),
      // A few small tearooms may be skipped at a cost when the day is tight.
      priority: k.kind === "Tearoom" && rng() < 0.5 ? 60 : undefined,
    });
  }

  const fleet: DemoVehicle[] = [
    {
      id: "Van 1 Kestrel",
      capacityKg: 900,
      capacityCrates: 150,
      start: BAKERY_DEPOT,
      end: BAKERY_DEPOT,
      shiftStartMin: 270,
      shiftEndMin: 690,
      fixedCost: 55,
      costPerKm: 0.34,
      costPerHour: 19,
      speedKmh: 38,
    },
    {
      id: "Van 2 Heron",
      capacityKg: 700,
      capacityCrates: 120,
      start: BAKERY_DEPOT,
      end: BAKERY_DEPOT,
      shiftStartMin: 300,
      shiftEndMin: 720,
      fixedCost: 50,
      costPerKm: 0.3,
      costPerHour: 19,
      speedKmh: 40,
    },
    {
      id: "Van 3 Linnet",
      capacityKg: 500,
      capacityCrates: 85,
      start: BAKERY_DEPOT,
      end: BAKERY_DEPOT,
      shiftStartMin: 300,
      shiftEndMin: 660,
      fixedCost: 40,
      costPerKm: 0.22,
      costPerHour: 18,
      speedKmh: 35,
      maxStops: 22,
    },
    {
      id: "Van 4 Plover",
      capacityKg: 800,
      capacityCrates: 135,
      start: BAKERY_DEPOT,
      end: BAKERY_DEPOT,
      shiftStartMin: 330,
      shiftEndMin: 750,
      fixedCost: 52,
      costPerKm: 0.32,
      costPerHour: 19,
      speedKmh: 40,
    },
    {
      id: "Van 5 Tadcaster",
      capacityKg: 600,
      capacityCrates: 100,
      start: TADCASTER_DEPOT,
      end: TADCASTER_DEPOT,
      shiftStartMin: 270,
      shiftEndMin: 660,
      fixedCost: 45,
      costPerKm: 0.3,
      costPerHour: 18,
      speedKmh: 45,
    },
  ];
  return { stops, fleet };
}

/** A point `km` away from (lat, lon) in direction `bearingRad`, on a local flat approximation (fine within 25 km). */
function offset(lat: number, lon: number, km: number, bearingRad: number): { lat: number; lon: number } {
  const dLat = (km * Math.cos(bearingRad)) / 111.32;
  const dLon = (km * Math.sin(bearingRad)) / (111.32 * Math.cos((lat * Math.PI) / 180));
  return { lat: round(lat + dLat, 5), lon: round(lon + dLon, 5) };
}

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}
