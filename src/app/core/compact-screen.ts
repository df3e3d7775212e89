import { BreakpointObserver } from '@angular/cdk/layout';
import { inject, type Signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { map } from 'rxjs';

/** The phone-width breakpoint the charts and tables adapt to. */
export const COMPACT_SCREEN = '(max-width: 599.98px)';

/**
 * Whether the screen is phone-width, as a signal (fewer axis labels, smaller type, stacked rows).
 * Call it in an injection context (a field initialiser of a component).
 */
export function compactScreen(): Signal<boolean> {
  return toSignal(
    inject(BreakpointObserver)
      .observe(COMPACT_SCREEN)
      .pipe(map((s) => s.matches)),
    { initialValue: false },
  );
}
