import type { Provider } from '@angular/core';
import { provideEchartsCore } from 'ngx-echarts';

/** ECharts for `<div echarts>`: the library loads with the first chart, not with the app. */
export function provideCharts(): Provider {
  return provideEchartsCore({ echarts: () => import('./echarts-setup').then((m) => m.default) });
}
