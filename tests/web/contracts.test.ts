import { describe, expect, it } from 'vitest';
import { createUserBody, passwordSchema, PASSWORD_MAX_BYTES } from '../../server/contracts/users';
import { createUserSchema } from '../../web/src/features/users/api/create-user';
import { resultsBody } from '../../server/contracts/workshop';
import { ApiError, checked } from '../../web/src/lib/api-client';

describe('rules shared by the server and the client forms', () => {
  it('the add-person form checks with the very rules the server parses the request with', () => {
    expect(createUserSchema.shape.password).toBe(createUserBody.shape.password);
    expect(createUserSchema.shape.email).toBe(createUserBody.shape.email);
    expect(createUserSchema.shape.name).toBe(createUserBody.shape.name);
  });

  it('when a password is over 72 bytes in UTF-8 though under 72 characters, then it is refused the same way in Node and the browser (computed: "é" is 2 bytes)', () => {
    expect(passwordSchema.safeParse('é'.repeat(36)).success).toBe(true); // 72 bytes
    expect(passwordSchema.safeParse('é'.repeat(37)).success).toBe(false); // 74 bytes, 37 characters
    expect(Buffer.byteLength('é'.repeat(37), 'utf8')).toBeGreaterThan(PASSWORD_MAX_BYTES);
  });

  it('when an e-mail is blank or padded, then the message says it is required, and padding is trimmed', () => {
    const blank = createUserBody.safeParse({ name: 'Ana', email: '  ', role: 'driver', password: 'long-enough-pw' });
    expect(blank.success).toBe(false);
    expect(blank.error!.issues[0]).toMatchObject({ path: ['email'], message: 'is required' });
    const padded = createUserBody.parse({ name: 'Ana', email: ' ana@reboundry.test ', role: 'driver', password: 'long-enough-pw' });
    expect(padded.email).toBe('ana@reboundry.test');
  });
});

describe('the workshop forms checked by the server rules before sending', () => {
  const body = (adhesionPct: number | null) => ({ odometerKm: 120_000, corners: [{ position: 'FL', adhesionPct, findings: [], verdict: 'ok' }] });

  it('when a lane reading is out of range, then the client refuses it with the field message the server would give, on the same path', () => {
    const err = (() => {
      try {
        checked(resultsBody('2026-12-03'), body(150), '/api/inspections/1/results');
      } catch (e) {
        return e as ApiError;
      }
    })();
    expect(err).toBeInstanceOf(ApiError);
    expect(err!.status).toBe(400);
    expect(err!.fields).toEqual({ 'corners.0.adhesionPct': 'must be 0–100 %' });
    expect(checked(resultsBody('2026-12-03'), body(62), '/x').corners[0].adhesionPct).toBe(62);
  });

  it('when the inspection is on 29 February, then a follow-up may be booked up to 28 February a year on (computed: there is no 29th)', () => {
    const follow = (d: string) => resultsBody('2028-02-29').safeParse({ ...body(62), corners: [{ position: 'FL', adhesionPct: 62, findings: [], verdict: 'monitor' }], followUpOn: d });
    expect(follow('2029-02-28').success).toBe(true);
    expect(follow('2029-03-01').success).toBe(false);
    expect(follow('2028-02-29').success).toBe(false);
  });
});
