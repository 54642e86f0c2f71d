/**
 * A project's device library: its NPN .model cards a page at a time (name, IS, BF, VAF, file,
 * who uploaded them and when), found by name, each card's text and notes on demand; for the
 * roles that may, an upload of a text file of cards, and per card a replacement (a file with
 * the one new card of that name) or a removal. Replaced and removed cards stay readable for the
 * specs that recorded them, listed under "Removed and replaced". A refused file lists its
 * problems with their line numbers; nothing of it was stored.
 */
import { useQuery } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { DEVICE_LIBRARY_QUOTA } from '#shared/devices/types';
import { FileUploadButton, UploadProblems } from '../../../components/forms/file-upload';
import { Button } from '../../../components/ui/button';
import { EmptyState, ErrorPanel, Loading } from '../../../components/ui/feedback';
import { Quantity } from '../../../components/ui/quantity';
import { Sheet } from '../../../components/ui/sheet';
import { DenseTable, Td, Th, Tr } from '../../../components/ui/dense-table';
import { Pagination } from '../../../components/ui/pagination';
import { When } from '../../../components/ui/when';
import { DEVICE_PAGE_SIZE, projectDevicesQuery, type LibraryDevice } from '../../../lib/device-library';
import { useRemoveDevice, useReplaceDevice, useUploadDevices } from '../api/device-mutations';

/** File types offered by the picker; the server decides by content, not by name. */
const ACCEPT = '.lib,.mod,.model,.cir,.sp,.txt,text/plain';

type Shelf = 'library' | 'former';

export function DeviceLibrary({ projectId, canUpload }: { projectId: number; canUpload: boolean }) {
  const [shelf, setShelf] = useState<Shelf>('library');
  const [page, setPage] = useState(1);
  const [filter, setFilter] = useState('');
  const devices = useQuery(projectDevicesQuery(projectId, { page, q: filter, state: shelf }));
  const upload = useUploadDevices(projectId);
  const replace = useReplaceDevice(projectId);
  const remove = useRemoveDevice(projectId);
  const [done, setDone] = useState<string | null>(null);
  const filterId = useId();

  const onFile = (file: File) => {
    setDone(null);
    upload.mutate(file, { onSuccess: (result) => setDone(`Added ${result.items.map((d) => d.name).join(', ')} from ${file.name}.`) });
  };
  const onReplace = (device: LibraryDevice, file: File) => {
    setDone(null);
    remove.reset();
    replace.mutate(
      { deviceId: device.id, file },
      { onSuccess: () => setDone(`Replaced ${device.name} with the card from ${file.name}; specs filled from the old text keep it, marked replaced.`) },
    );
  };
  const onRemove = (device: LibraryDevice) => {
    setDone(null);
    replace.reset();
    remove.mutate(device.id, { onSuccess: () => setDone(`Removed ${device.name} from the library; specs filled from it keep its text, marked removed.`) });
  };
  const showShelf = (next: Shelf) => {
    setShelf(next);
    setPage(1);
  };

  const control = canUpload && <FileUploadButton label="Upload .model cards" accept={ACCEPT} pending={upload.isPending} onFile={onFile} />;
  const error = upload.error ?? replace.error ?? remove.error;
  const data = devices.data;

  return (
    <Sheet title="Device library" aria-label="Device library" actions={control} className="mb-6">
      <p className="mb-3 text-xs leading-snug text-ink-soft dark:text-night-ink-soft">
        NPN transistor models from SPICE .model cards. A spec filled from a card takes its whole Gummel-Poon model; parameters the engine does not model are listed under
        the card and still simulated in the SPICE check. The figures are estimates to confirm by simulation and bench measurement. A library holds up to {DEVICE_LIBRARY_QUOTA.cards} cards; a replaced or removed card stays readable for
        the specs filled from it.
      </p>
      {error && <UploadProblems error={error} className="mb-3" />}
      {done && (
        <p role="status" className="mb-3 text-sm text-fern dark:text-fern-bright">
          <span aria-hidden="true">✓ </span>
          {done}
        </p>
      )}
      <div className="mb-3 flex flex-wrap items-end gap-3">
        <div className="min-w-48 grow sm:grow-0">
          <label htmlFor={filterId} className="mb-1 block text-xs font-medium">
            Find a card by name
          </label>
          <input
            id={filterId}
            type="search"
            maxLength={64}
            value={filter}
            onChange={(event) => {
              setFilter(event.target.value);
              setPage(1);
            }}
            placeholder="FH-N1…"
            className="w-full rounded-md border border-rule bg-sheet px-2 py-1.5 text-sm dark:border-night-rule dark:bg-night-sheet"
          />
        </div>
        <div role="group" aria-label="Which cards" className="flex gap-1">
          <Button variant={shelf === 'library' ? 'secondary' : 'quiet'} aria-pressed={shelf === 'library'} className="px-2.5 py-1.5" onClick={() => showShelf('library')}>
            In the library
          </Button>
          <Button variant={shelf === 'former' ? 'secondary' : 'quiet'} aria-pressed={shelf === 'former'} className="px-2.5 py-1.5" onClick={() => showShelf('former')}>
            Removed and replaced
          </Button>
        </div>
      </div>
      {devices.isPending ? (
        <Loading what="Loading the device library" />
      ) : devices.isError ? (
        <ErrorPanel error={devices.error} retry={() => void devices.refetch()} />
      ) : data && data.total === 0 ? (
        filter.trim() !== '' ? (
          <EmptyState title="No card matches">No card {shelf === 'former' ? 'removed or replaced' : 'in the library'} has “{filter.trim()}” in its name.</EmptyState>
        ) : shelf === 'former' ? (
          <EmptyState title="None removed or replaced">Cards taken out of the library or replaced by a new text are kept here for the specs filled from them.</EmptyState>
        ) : (
          <EmptyState title="No device models yet">
            {canUpload ? 'Upload a text file of NPN .model cards (at most 256 KB).' : 'Systems engineers and designers upload .model cards here.'}
          </EmptyState>
        )
      ) : data ? (
        <>
          <DeviceTable
            devices={data.items}
            shelf={shelf}
            canChange={canUpload && shelf === 'library'}
            pending={replace.isPending || remove.isPending}
            onReplace={onReplace}
            onRemove={onRemove}
          />
          {data.total > DEVICE_PAGE_SIZE && <Pagination page={page} pageSize={DEVICE_PAGE_SIZE} total={data.total} onPage={setPage} label="Device library pages" />}
        </>
      ) : null}
    </Sheet>
  );
}

function DeviceTable({
  devices,
  shelf,
  canChange,
  pending,
  onReplace,
  onRemove,
}: {
  devices: readonly LibraryDevice[];
  shelf: Shelf;
  canChange: boolean;
  pending: boolean;
  onReplace: (device: LibraryDevice, file: File) => void;
  onRemove: (device: LibraryDevice) => void;
}) {
  return (
    <DenseTable caption={shelf === 'library' ? 'Device models of this project' : 'Removed and replaced device models of this project'}>
      <thead>
        <tr>
          <Th>Name</Th>
          <Th className="text-right">IS</Th>
          <Th className="text-right">BF</Th>
          <Th className="text-right">VAF</Th>
          <Th>File</Th>
          <Th>Uploaded</Th>
          {shelf === 'former' && <Th>Left the library</Th>}
          {canChange && (
            <Th>
              <span className="sr-only">Actions</span>
            </Th>
          )}
        </tr>
      </thead>
      <tbody>
        {devices.map((d) => (
          <Tr key={d.id}>
            <Td className="align-top">
              <details>
                <summary className="cursor-pointer font-medium whitespace-nowrap">{d.name}</summary>
                <pre className="mt-1 max-w-xl overflow-x-auto rounded bg-paper p-2 text-xs dark:bg-night">{d.card}</pre>
                {d.notes.map((note) => (
                  <p key={note} className="mt-1 max-w-xl text-xs leading-snug text-ink-soft dark:text-night-ink-soft">
                    <span aria-hidden="true">! </span>
                    {note}
                  </p>
                ))}
              </details>
            </Td>
            <Td className="text-right align-top">
              <Quantity value={d.device.saturationCurrentA} unit="A" />
            </Td>
            <Td className="text-right align-top tabular-nums">{d.device.beta}</Td>
            <Td className="text-right align-top">{d.device.earlyVoltageV === 0 ? 'none' : <Quantity value={d.device.earlyVoltageV} unit="V" />}</Td>
            <Td className="align-top">
              <span title={`sha256 ${d.checksum}`}>{d.fileName}</span>
              <span className="block text-xs text-ink-soft dark:text-night-ink-soft">line {d.line}</span>
            </Td>
            <Td className="align-top text-ink-soft dark:text-night-ink-soft">
              {d.uploadedBy.displayName}, <When iso={d.uploadedAt} />
            </Td>
            {shelf === 'former' && (
              <Td className="align-top text-ink-soft dark:text-night-ink-soft">
                {d.state === 'replaced' ? 'Replaced by a new text' : 'Removed'}
                {d.retiredBy && `, ${d.retiredBy.displayName}`}
                {d.retiredAt && (
                  <>
                    , <When iso={d.retiredAt} />
                  </>
                )}
              </Td>
            )}
            {canChange && (
              <Td className="align-top">
                <CardActions device={d} pending={pending} onReplace={onReplace} onRemove={onRemove} />
              </Td>
            )}
          </Tr>
        ))}
      </tbody>
    </DenseTable>
  );
}

/** Replace (a file picker) and Remove (asked once more before it is done) for one card. */
function CardActions({
  device,
  pending,
  onReplace,
  onRemove,
}: {
  device: LibraryDevice;
  pending: boolean;
  onReplace: (device: LibraryDevice, file: File) => void;
  onRemove: (device: LibraryDevice) => void;
}) {
  const [asking, setAsking] = useState(false);
  if (asking) {
    return (
      <div className="flex max-w-56 flex-col gap-1.5 text-xs" role="group" aria-label={`Remove ${device.name}?`}>
        <span>Remove {device.name}? Specs filled from it keep its text.</span>
        <span className="flex gap-1.5">
          <Button
            variant="danger"
            className="px-2 py-1 text-xs"
            disabled={pending}
            onClick={() => {
              setAsking(false);
              onRemove(device);
            }}
          >
            Remove
          </Button>
          <Button variant="secondary" className="px-2 py-1 text-xs" onClick={() => setAsking(false)}>
            Keep
          </Button>
        </span>
      </div>
    );
  }
  return (
    <div className="flex flex-wrap items-center gap-1.5 whitespace-nowrap">
      <FileUploadButton label="Replace…" srLabel={`Replace ${device.name} with a new card`} accept={ACCEPT} pending={pending} onFile={(file) => onReplace(device, file)} />
      <Button variant="quiet" className="px-2 py-1.5" disabled={pending} onClick={() => setAsking(true)}>
        Remove<span className="sr-only"> {device.name}</span>
      </Button>
    </div>
  );
}
