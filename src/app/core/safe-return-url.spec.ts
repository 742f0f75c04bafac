import { describe, expect, it } from 'vitest';
import { safeReturnUrl } from './safe-return-url';

describe('safeReturnUrl', () => {
  it('when the target is a path inside the app, then it is kept with its query', () => {
    expect(safeReturnUrl('/invitations/abc?x=1')).toBe('/invitations/abc?x=1');
  });

  it('when the target would leave the app, then the projects page is used instead', () => {
    for (const outside of ['https://elsewhere.example/', '//elsewhere.example', '/\\elsewhere.example', 'javascript:alert(1)', '', null, undefined]) {
      expect(safeReturnUrl(outside)).toBe('/projects');
    }
  });
});
