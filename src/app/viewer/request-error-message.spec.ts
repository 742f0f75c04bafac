// HttpErrorResponse's module declares injectables that need the JIT compiler when loaded outside an Angular build.
import '@angular/compiler';
import { HttpErrorResponse } from '@angular/common/http';
import { describe, expect, it } from 'vitest';
import { requestErrorMessage } from './request-error-message';

const bytes = (text: string) => new TextEncoder().encode(text).buffer as ArrayBuffer;

describe('requestErrorMessage', () => {
  it('when a binary request fails with a JSON body, then the server message is read from the bytes', () => {
    const err = new HttpErrorResponse({ status: 409, error: bytes('{"error":{"code":"conflict","message":"The trajectory is inspecting."}}') });
    expect(requestErrorMessage(err, 'Frames could not be loaded')).toBe('The trajectory is inspecting.');
  });

  it('when a JSON request fails, then its parsed body gives the message', () => {
    const err = new HttpErrorResponse({ status: 404, error: { error: { message: 'Trajectory not found.' } } });
    expect(requestErrorMessage(err, 'x')).toBe('Trajectory not found.');
  });

  it('when the body says nothing useful, then the fallback names the status', () => {
    expect(requestErrorMessage(new HttpErrorResponse({ status: 502, error: bytes('<html>bad gateway</html>') }), 'Frames could not be loaded'))
      .toBe('Frames could not be loaded (HTTP 502)');
    expect(requestErrorMessage(new HttpErrorResponse({ status: 0 }), 'x')).toMatch(/could not be reached/);
  });

  it('when the failure is not HTTP, then its own message is used', () => {
    expect(requestErrorMessage(new Error('The frames response could not be read: bad header'), 'x')).toMatch(/bad header/);
    expect(requestErrorMessage('odd', 'Fallback')).toBe('Fallback');
  });
});
