// Set-up of the "routes" Vitest project (jsdom): unmount what a test rendered and take the fake
// fetch away after each test, so no test sees another's page or requests.
import { cleanup } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});
