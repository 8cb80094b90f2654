import type { HeadlineNumbers } from "@/lib/reports/headline-numbers";
import { headlineTable, type HeadlineTable } from "@/lib/reports/headline-table";

/** A list table (what an interval log does not hold) reads as short statements at any width. */
function HeadlineList({ t }: { t: HeadlineTable }) {
  return (
    <ul className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2" data-testid={`headline-${t.key}-list`}>
      {t.rows.map((r) => (
        <li key={r.key} data-testid={`headline-item-${r.key}`}>
          <span className="font-medium">{r.label}</span>: <span className="text-ink-soft">{r.cells[0]}</span>
        </li>
      ))}
    </ul>
  );
}

/** A table of rows on a wide screen, a card per row on a phone (both in the page; CSS shows one). */
function HeadlineRows({ t }: { t: HeadlineTable }) {
  return (
    <>
      <div className="hidden overflow-x-auto md:block" data-testid={`headline-${t.key}-table`}>
        <table className="table-base tabular-nums">
          <thead>
            <tr>
              <th scope="col" className="!normal-case !tracking-normal">{t.rowHeader}</th>
              {t.columns.map((c) => <th key={c.key} scope="col" className="!normal-case !tracking-normal">{c.label}</th>)}
            </tr>
          </thead>
          <tbody>
            {t.rows.map((r) => (
              <tr key={r.key} data-testid={`headline-row-${r.key}`}>
                <th scope="row" className="!text-sm !font-medium !normal-case !tracking-normal !text-ink">{r.label}</th>
                {r.cells.map((cell, i) => <td key={t.columns[i]!.key}>{cell}</td>)}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ul className="grid gap-2 md:hidden" data-testid={`headline-${t.key}-cards`}>
        {t.rows.map((r) => (
          <li key={r.key} className="rounded-md border border-line bg-paper p-3" data-testid={`headline-card-${r.key}`}>
            <p className="font-medium">{r.label}</p>
            <dl className="mt-1 grid grid-cols-2 gap-x-3 gap-y-1 text-sm tabular-nums">
              {t.columns.map((c, i) => (
                <div key={c.key} className="min-w-0">
                  <dt className="text-xs text-ink-soft">{c.label}</dt>
                  <dd className="break-words">{r.cells[i]}</dd>
                </div>
              ))}
            </dl>
          </li>
        ))}
      </ul>
    </>
  );
}

/**
 * The headline numbers above the per-order table: a row per channel or pair on a wide screen,
 * a card per row on a phone; for an interval log its logged statistics and what it does not hold.
 * Used by the signed-in sheet and the share page.
 */
export function HeadlineSummary({ headline }: { headline: HeadlineNumbers | null }) {
  if (!headline) return null;
  const tables = headlineTable(headline);
  if (tables.length === 0) return null;
  return (
    <section className="panel space-y-4" aria-labelledby="headline-title" data-testid="headline-summary">
      <h2 id="headline-title">Headline numbers</h2>
      {tables.map((t) => (
        <div key={t.key} className="space-y-2" data-testid={`headline-${t.key}`}>
          <h3 className="text-sm font-semibold text-ink-soft">{t.title}</h3>
          {t.caption && <p className="text-xs text-ink-soft" data-testid={`headline-${t.key}-caption`}>{t.caption}</p>}
          {t.list ? <HeadlineList t={t} /> : <HeadlineRows t={t} />}
        </div>
      ))}
    </section>
  );
}
