import { describe, expect, it } from 'vitest';
import { ROLES } from '../../shared/domain/roles';
import { homePathForRole, safeNextPath } from './home-path';

describe('homePathForRole', () => {
  it.each([
    ['contractor_owner', '/contractor'],
    ['contractor_estimator', '/contractor'],
    ['merchant_owner', '/desk'],
    ['merchant_sales', '/desk'],
    ['merchant_dispatcher', '/yard'],
    ['driver', '/driver'],
  ] as const)('sends a %s to %s', (role, path) => {
    expect(homePathForRole(role)).toBe(path);
  });

  it('gives every role a home inside the app', () => {
    for (const role of ROLES) expect(homePathForRole(role)).toMatch(/^\/[a-z]+$/);
  });
});

describe('safeNextPath', () => {
  it('keeps a path inside the app, with its query', () => {
    expect(safeNextPath('/team?tab=invitations')).toBe('/team?tab=invitations');
  });

  it.each([
    ['an absolute URL to another site', 'https://elsewhere.test/'],
    ['a protocol-relative URL', '//elsewhere.test/x'],
    ['a backslash trick', '/\\elsewhere.test'],
    ['the sign-in page itself', '/sign-in?next=/team'],
    ['nothing', null],
  ])('refuses %s', (_label, next) => {
    expect(safeNextPath(next)).toBeNull();
  });
});
