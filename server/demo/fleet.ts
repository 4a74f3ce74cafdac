/** The demo fleet's people, specs and vehicles. */
import { subDays } from 'date-fns';
import { Depot, SpecAxle, SuspensionSpec, User, Vehicle } from '../db/models';
import { DEPOTS, FIRST, LAST, SPECS, type SpecSeed } from './fleet-data';
import { day, type SeedContext } from './seed-context';

export interface DemoSpec {
  row: SuspensionSpec;
  seed: SpecSeed;
}
export interface DemoVehicle {
  v: Vehicle;
  spec: SpecSeed;
  depotIdx: number;
  workingDayKm: number;
}

/** Depots, the demo sign-ins and the drivers. */
export async function seedPeople(ctx: SeedContext, pw: string) {
  const { opts } = ctx;
  const depots = await Depot.bulkCreate(DEPOTS, { ...opts, returning: true });

  await User.bulkCreate(
    [
      { name: 'Maren Okafor', email: 'manager@reboundry.test', role: 'manager', passwordHash: pw, depotId: null },
      { name: 'Tomasz Reyes', email: 'mechanic@reboundry.test', role: 'mechanic', passwordHash: pw, depotId: depots[0].id },
      { name: 'Ines Garland', email: 'mechanic.millbrook@reboundry.test', role: 'mechanic', passwordHash: pw, depotId: depots[1].id },
    ],
    opts,
  );
  const drivers = await User.bulkCreate(
    FIRST.map((f, i) => ({
      name: `${f} ${LAST[i]}`,
      email: i === 0 ? 'driver@reboundry.test' : `${f.toLowerCase()}.${LAST[i].toLowerCase().replace(/[^a-z]/g, '')}@reboundry.test`,
      role: 'driver' as const,
      passwordHash: pw,
      depotId: depots[i % 2].id,
    })),
    { ...opts, returning: true },
  );
  return { depots, drivers };
}

/** The suspension specs and their axles. */
export async function seedSpecs(ctx: SeedContext) {
  const { opts } = ctx;
  // Specs and axles
  const specs: { row: SuspensionSpec; seed: SpecSeed }[] = [];
  for (const s of SPECS) {
    const row = await SuspensionSpec.create({ name: s.name, vehicleClass: s.vehicleClass, description: s.description }, opts);
    await SpecAxle.bulkCreate(
      s.axles.map((a, axleIndex) => ({ ...a, axleIndex, specId: row.id })),
      opts,
    );
    specs.push({ row, seed: s });
  }
  return specs;
}

/** The vehicles, each with a daily distance of its own and a driver while there are drivers. */
export async function seedVehicles(ctx: SeedContext, specs: DemoSpec[], depots: Depot[], drivers: User[]) {
  const { opts, rand, today, demo } = ctx;
  // Vehicles. Each has a daily distance of its own (km per working day); its odometer before
  // the trips on record grew at the rate its trips on record show.
  let vehicleNo = 0;
  const vehicles: { v: Vehicle; spec: SpecSeed; depotIdx: number; workingDayKm: number }[] = [];
  for (const { row, seed } of specs) {
    for (let i = 0; i < Math.min(seed.count, demo.vehiclesPerSpec ?? seed.count); i++) {
      const depotIdx = vehicleNo % 2;
      const commissioned = subDays(today, seed.ageDays[0] + Math.floor(rand() * (seed.ageDays[1] - seed.ageDays[0])));
      const workingDayKm = seed.workingDayKm[0] + rand() * (seed.workingDayKm[1] - seed.workingDayKm[0]);
      const v = await Vehicle.create(
        {
          fleetNumber: `${seed.prefix}-${String(101 + i)}`,
          plate: `BK${String(20 + (vehicleNo % 6))} ${String.fromCharCode(65 + (vehicleNo % 26))}${String.fromCharCode(66 + ((vehicleNo * 7) % 24))}${String.fromCharCode(67 + ((vehicleNo * 3) % 23))}`,
          specId: row.id,
          depotId: depots[depotIdx].id,
          driverId: vehicleNo < drivers.length ? drivers[vehicleNo].id : null,
          odometerKm: 0, // set below, from the trips
          status: vehicleNo === 7 ? 'workshop' : vehicleNo === 40 ? 'retired' : 'in_service',
          commissionedAt: day(commissioned),
        },
        opts,
      );
      vehicles.push({ v, spec: seed, depotIdx, workingDayKm });
      vehicleNo++;
    }
  }
  return vehicles;
}
