import { useId, useState } from 'react';
import type { ImportReport } from '@shared/schemas/items';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { Table, TBody, Td, Th, THead, Tr } from '@/components/ui/table';
import { errorMessage } from '@/lib/api';
import { formatBytes } from '@/lib/format';
import { IMPORT_MAX_BYTES, rejectedReport, useImportItems } from '../api/import-items';
import { exampleCsvHref, IMPORT_COLUMNS } from './example-csv';

const FIELD_COLUMN: Record<string, string> = {
  quantityOwned: 'quantity_owned',
  rentalPriceCents: 'rental_price',
  extraDayPriceCents: 'extra_day_price',
  replacementValueCents: 'replacement_value',
  purchaseCostCents: 'purchase_cost',
  tentType: 'tent_type',
  widthFt: 'width_ft',
  lengthFt: 'length_ft',
  heightFt: 'height_ft',
  sectionLengthFt: 'section_length_ft',
  polesPerSetup: 'poles_per_setup',
  stakesPerSetup: 'stakes_per_setup',
  ballastPerSetupLbs: 'ballast_per_setup_lbs',
  serviceType: 'service_type',
};

function RejectedRows({ report }: { report: ImportReport }) {
  return (
    <Table caption="Rejected rows">
      <THead>
        <Tr>
          <Th>Line</Th>
          <Th>SKU or name</Th>
          <Th>What to fix</Th>
        </Tr>
      </THead>
      <TBody>
        {report.rejected.map((row) => (
          <Tr key={row.line}>
            <Th scope="row" className="py-3 align-top tabular-nums">
              {row.line}
            </Th>
            <Td className="align-top">
              {row.sku ? <span className="block font-mono text-xs">{row.sku}</span> : null}
              {row.name || (row.sku ? null : <span className="text-canvas-600">No name</span>)}
            </Td>
            <Td className="align-top">
              <ul className="space-y-1">
                {Object.entries(row.errors).map(([field, message]) => (
                  <li key={field}>
                    <span className="font-mono text-xs font-semibold">{FIELD_COLUMN[field] ?? field}</span>: {message}
                  </li>
                ))}
              </ul>
            </Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}

/** Import the price list from a CSV file: check it first (nothing saved), then import. */
export function ImportItemsDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  const fileId = useId();
  const [file, setFile] = useState<File | null>(null);
  const [tooLarge, setTooLarge] = useState(false);
  const importer = useImportItems();
  const report = importer.data ?? rejectedReport(importer.error);
  const otherError = importer.isError && !rejectedReport(importer.error) ? errorMessage(importer.error) : null;
  const running = importer.isPending ? (importer.variables?.dryRun ? 'check' : 'import') : null;

  const run = (dryRun: boolean) => {
    if (!file || tooLarge) return;
    importer.mutate({ file, dryRun });
  };

  const close = () => {
    setFile(null);
    setTooLarge(false);
    importer.reset();
    onClose();
  };

  return (
    <Dialog
      open={open}
      wide
      title="Import items from a CSV file"
      busy={importer.isPending}
      onClose={close}
      footer={
        <>
          <Button variant="secondary" onClick={close} disabled={importer.isPending}>
            Close
          </Button>
          <Button variant="secondary" onClick={() => run(true)} isLoading={running === 'check'} disabled={!file || tooLarge || importer.isPending}>
            Check file
          </Button>
          <Button onClick={() => run(false)} isLoading={running === 'import'} disabled={!file || tooLarge || importer.isPending}>
            Import
          </Button>
        </>
      }
    >
      <div className="space-y-4 text-sm">
        <p>
          One row per item, with a header row naming the columns in any order. Prices are in dollars, like 125.00. If any row has a problem,
          nothing is saved: fix the rows listed and try again.{' '}
          <a className="font-semibold text-pine-700 underline" href={exampleCsvHref()} download="guyline-items-example.csv">
            Download an example CSV
          </a>
        </p>
        <details>
          <summary className="cursor-pointer font-semibold">Columns</summary>
          <p className="mt-1 font-mono text-xs break-words">{IMPORT_COLUMNS.join(', ')}</p>
          <p className="mt-1">taxable and active take true/false, yes/no or 1/0. tent_type is pole or frame; service_type is delivery, setup, takedown or other.</p>
        </details>
        <div>
          <label htmlFor={fileId} className="mb-1 block font-semibold text-canvas-800">
            CSV file
          </label>
          <input
            id={fileId}
            type="file"
            accept=".csv,text/csv"
            aria-describedby={`${fileId}-hint`}
            className="block w-full text-sm file:mr-3 file:rounded-md file:border file:border-canvas-300 file:bg-white file:px-3 file:py-2 file:font-semibold"
            onChange={(event) => {
              const next = event.target.files?.[0] ?? null;
              setFile(next);
              setTooLarge(Boolean(next && next.size > IMPORT_MAX_BYTES));
              importer.reset();
            }}
          />
          <p id={`${fileId}-hint`} className="mt-1 text-canvas-600">
            {file ? `${file.name}, ${formatBytes(file.size)}. ` : ''}At most 1 MB.
          </p>
        </div>
        {tooLarge ? <Alert tone="danger">That file is larger than 1 MB. Split it into smaller files.</Alert> : null}
        <div aria-live="polite" className="space-y-3">
          {otherError ? <Alert tone="danger">{otherError}</Alert> : null}
          {report && report.rejected.length > 0 ? (
            <>
              <Alert tone="danger" title={`${report.rejected.length} of ${report.rows} rows have problems. Nothing was saved.`}>
                Fix these rows in the file and check it again.
              </Alert>
              <RejectedRows report={report} />
            </>
          ) : report && report.dryRun ? (
            <Alert tone="success" title="The file looks right.">
              {report.rows} {report.rows === 1 ? 'row' : 'rows'} can be imported. Nothing has been saved yet: choose Import.
            </Alert>
          ) : report ? (
            <Alert tone="success" title="Import finished.">
              {report.created} {report.created === 1 ? 'item' : 'items'} added to the catalog.
            </Alert>
          ) : null}
        </div>
      </div>
    </Dialog>
  );
}
