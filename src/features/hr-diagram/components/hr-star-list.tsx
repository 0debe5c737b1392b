import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { HrStar } from '@shared/schemas/hr';
import { LedgerBody, LedgerCell, LedgerHead, LedgerHeaderCell, LedgerRow, LedgerTable } from '@/components/ui/ledger-table';
import { linkClasses } from '@/components/ui/button';
import { starValues } from './hr-plot';

/**
 * The plotted stars as a table of links, for the keyboard and for screen
 * readers (the canvas answers only the mouse). Rows are built only while the
 * list is open: 10 000 hidden rows would cost the page its first second.
 */
export function HrStarList({ stars, hrefOf }: { stars: HrStar[]; hrefOf: (star: HrStar) => string }) {
  const [open, setOpen] = useState(false);
  return (
    <details className="mt-4 rounded-sm border border-rule px-4 py-2" onToggle={(event) => setOpen(event.currentTarget.open)}>
      <summary className="cursor-pointer py-1 text-sm font-semibold text-ink">Stars on the diagram ({stars.length})</summary>
      {open ? (
        <LedgerTable className="mt-2">
          <caption className="sr-only">Stars on the diagram, with their temperature, luminosity and luminosity class</caption>
          <LedgerHead>
            <tr>
              <LedgerHeaderCell scope="col">Target</LedgerHeaderCell>
              <LedgerHeaderCell scope="col" numeric>
                Temperature
              </LedgerHeaderCell>
              <LedgerHeaderCell scope="col" numeric>
                Luminosity
              </LedgerHeaderCell>
              <LedgerHeaderCell scope="col">Luminosity class</LedgerHeaderCell>
            </tr>
          </LedgerHead>
          <LedgerBody>
            {stars.map((star) => {
              const values = starValues(star);
              return (
                <LedgerRow key={star.id}>
                  <LedgerCell className="whitespace-nowrap">
                    <Link to={hrefOf(star)} className={linkClasses}>
                      {star.designation}
                    </Link>
                  </LedgerCell>
                  <LedgerCell numeric>
                    {values.temperature} <span className="text-xs text-ink-soft">{star.temperature.status}</span>
                  </LedgerCell>
                  <LedgerCell numeric>
                    {values.luminosity} <span className="text-xs text-ink-soft">{star.luminosity.status}</span>
                  </LedgerCell>
                  <LedgerCell className="text-ink-soft">{star.luminosityClass ?? 'not derived'}</LedgerCell>
                </LedgerRow>
              );
            })}
          </LedgerBody>
        </LedgerTable>
      ) : null}
    </details>
  );
}
