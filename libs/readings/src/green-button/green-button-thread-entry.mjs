// Entry of the Green Button reading thread. The product runs TypeScript through tsx; a worker thread
// starts without the parent's loader when the parent is a test runner, so it registers tsx itself.
import { register } from 'tsx/esm/api';

register();
await import('./green-button-thread.ts');
