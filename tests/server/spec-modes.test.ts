import { describe, expect, it } from 'vitest';
import { serverForFile } from '../support/server';
import { ApiClient, DEMO } from '../support/client';

const srv = serverForFile();

type Modes = { bodyHz: number; bodyDampingRatio: number; wheelHz: number; wheelDampingRatio: number };
type Axle = { label: string; corner: Record<string, number>; ratedDamperLifeKm: number; modes: Modes };

describe('modes in the spec list', () => {
  it('when specs are listed, then each axle carries the same two-mass modes the editor’s preview computes for it', async () => {
    const c = new ApiClient(srv.url);
    await c.login(DEMO.manager);
    const list = await c.get<{ items: { id: number; vehicleClass: string; axles: Axle[] }[] }>('/api/specs');
    expect(list.status).toBe(200);
    for (const spec of list.body.items) {
      const preview = await c.json<{ axles: { modes: Modes }[] }>('POST', '/api/specs/preview', {
        vehicleClass: spec.vehicleClass,
        axles: spec.axles.map((a) => ({ label: a.label, ...a.corner, ratedDamperLifeKm: a.ratedDamperLifeKm })),
      });
      expect(preview.status).toBe(200);
      spec.axles.forEach((a, i) => expect(a.modes).toEqual(preview.body.axles[i].modes));
      const one = await c.get<{ spec: { axles: Axle[] } }>(`/api/specs/${spec.id}`);
      expect(one.body.spec.axles.map((a) => a.modes)).toEqual(spec.axles.map((a) => a.modes));
    }
  });
});
