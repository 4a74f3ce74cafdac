import { describe, expect, it } from 'vitest';
import { createUserBody, passwordSchema, PASSWORD_MAX_BYTES } from '../../server/contracts/users';
import { createUserSchema } from '../../web/src/features/users/api/create-user';

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
