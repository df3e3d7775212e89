import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { UnitSystem } from '@shared/units/units';
import { designValueRows, type DesignValueRow, type LooseDesignValues } from '../climate-format';

interface RowGroup {
  name: string;
  rows: DesignValueRow[];
}

/** Every design value of a site in the user's units, each with a plain sentence. */
@Component({
  selector: 'app-design-values-table',
  template: `
    <div class="tr-table-wrap">
      <table class="tr-table values" data-testid="design-values" aria-label="Design values">
        <thead>
          <tr>
            <th scope="col">Value</th>
            <th scope="col" class="num">{{ unitSystem() === 'SI' ? 'SI units' : 'IP units' }}</th>
            <th scope="col" class="explain">What it means</th>
          </tr>
        </thead>
        @for (group of groups(); track group.name) {
          <tbody>
            <tr class="group">
              <th scope="rowgroup" colspan="3">{{ group.name }}</th>
            </tr>
            @for (row of group.rows; track row.key) {
              <tr [attr.data-key]="row.key">
                <th scope="row">
                  <span class="label">{{ row.label }}</span>
                  <span class="explain-inline">{{ row.explanation }}</span>
                </th>
                <td class="num">{{ row.value }}</td>
                <td class="explain">{{ row.explanation }}</td>
              </tr>
            }
          </tbody>
        }
      </table>
    </div>
  `,
  styles: `
    table.values {
      border-collapse: collapse;
      font: var(--mat-sys-body-medium);

      th,
      td {
        padding: 0.375rem 0.75rem;
        text-align: left;
        vertical-align: top;
        border-bottom: 1px solid var(--tr-rule);
      }

      thead th {
        font-weight: 600;
        color: var(--mat-sys-on-surface-variant);
      }

      // Long names wrap, so the table fits its box at 1280 px.
      tbody th[scope='row'] {
        font-weight: 600;
        min-width: 9rem;
        max-width: 15rem;
      }

      .num {
        text-align: right;
        white-space: nowrap;
        font-variant-numeric: tabular-nums;
      }

      .explain {
        color: var(--mat-sys-on-surface-variant);
        min-width: 14rem;
      }

      .group th {
        background: color-mix(in srgb, var(--tr-ink) 6%, transparent);
        font: var(--mat-sys-title-small);
        font-weight: 600;
      }

      .explain-inline {
        display: none;
      }

      [data-key^='heating'] td.num {
        font-weight: 700;
        color: var(--tr-ink);
      }
    }

    // On a phone the sentence moves under the label, so the table needs no sideways scrolling.
    @media (max-width: 599.98px) {
      table.values {
        th,
        td {
          padding: 0.3125rem 0.5rem;
        }

        .explain {
          display: none;
        }

        tbody th[scope='row'] {
          white-space: normal;
        }

        .explain-inline {
          display: block;
          font-weight: 400;
          color: var(--mat-sys-on-surface-variant);
          font-size: 0.8125rem;
        }
      }
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class DesignValuesTable {
  readonly values = input.required<LooseDesignValues>();
  readonly unitSystem = input.required<UnitSystem>();

  protected readonly groups = computed<RowGroup[]>(() => {
    const groups: RowGroup[] = [];
    for (const row of designValueRows(this.values(), this.unitSystem())) {
      const last = groups.at(-1);
      if (last?.name === row.group) last.rows.push(row);
      else groups.push({ name: row.group, rows: [row] });
    }
    return groups;
  });
}
