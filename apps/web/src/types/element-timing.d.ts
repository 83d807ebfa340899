import 'react';

declare module 'react' {
  // The type parameter has to match React's own declaration to merge with it.
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface HTMLAttributes<T> {
    /** Element Timing: the browser reports when this element first reaches the screen (lib/use-after-paint.ts). */
    elementtiming?: string;
  }
}
