/**
 * A project's device library: its NPN .model cards (name, IS, BF, VAF, file, who uploaded them
 * and when), each card's text and notes on demand, and for the roles that may, an upload of a
 * text file of cards. A refused file lists its problems with their line numbers; nothing of it
 * was stored.
 */
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { FileUploadButton, UploadProblems } from '../../../components/forms/file-upload';
import { EmptyState, ErrorPanel, Loading } from '../../../components/ui/feedback';
import { Quantity } from '../../../components/ui/quantity';
import { Sheet } from '../../../components/ui/sheet';
import { DenseTable, Td, Th, Tr } from '../../projects/components/dense-table';
import { When } from '../../projects/components/when';
import { projectDevicesQuery, useUploadDevices, type LibraryDevice } from '../api/device-queries';

/** File types offered by the picker; the server decides by content, not by name. */
const ACCEPT = '.lib,.mod,.model,.cir,.sp,.txt,text/plain';

export function DeviceLibrary({ projectId, canUpload }: { projectId: number; canUpload: boolean }) {
  const devices = useQuery(projectDevicesQuery(projectId));
  const upload = useUploadDevices(projectId);
  const [added, setAdded] = useState<{ names: string[]; fileName: string } | null>(null);

  const onFile = (file: File) => {
    setAdded(null);
    upload.mutate(file, { onSuccess: (result) => setAdded({ names: result.items.map((d) => d.name), fileName: file.name }) });
  };

  const control = canUpload && <FileUploadButton label="Upload .model cards" accept={ACCEPT} pending={upload.isPending} onFile={onFile} />;

  return (
    <Sheet title="Device library" aria-label="Device library" actions={control} className="mb-6">
      <p className="mb-3 text-xs leading-snug text-ink-soft dark:text-night-ink-soft">
        NPN transistor models from SPICE .model cards. A spec can take a card’s IS, BF and VAF; the engine models nothing else of the card (BR = 1), so its figures are
        estimates to confirm by simulation and bench measurement.
      </p>
      {upload.error && <UploadProblems error={upload.error} className="mb-3" />}
      {added && (
        <p role="status" className="mb-3 text-sm text-fern dark:text-fern-bright">
          <span aria-hidden="true">✓ </span>
          Added {added.names.join(', ')} from {added.fileName}.
        </p>
      )}
      {devices.isPending ? (
        <Loading what="Loading the device library" />
      ) : devices.isError ? (
        <ErrorPanel error={devices.error} retry={() => void devices.refetch()} />
      ) : devices.data.items.length === 0 ? (
        <EmptyState title="No device models yet">
          {canUpload ? 'Upload a text file of NPN .model cards (at most 256 KB).' : 'Systems engineers and designers upload .model cards here.'}
        </EmptyState>
      ) : (
        <DeviceTable devices={devices.data.items} />
      )}
    </Sheet>
  );
}

function DeviceTable({ devices }: { devices: readonly LibraryDevice[] }) {
  return (
    <DenseTable caption="Device models of this project">
      <thead>
        <tr>
          <Th>Name</Th>
          <Th className="text-right">IS</Th>
          <Th className="text-right">BF</Th>
          <Th className="text-right">VAF</Th>
          <Th>File</Th>
          <Th>Uploaded</Th>
        </tr>
      </thead>
      <tbody>
        {devices.map((d) => (
          <Tr key={d.id}>
            <Td className="align-top">
              <details>
                <summary className="cursor-pointer font-medium">{d.name}</summary>
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
          </Tr>
        ))}
      </tbody>
    </DenseTable>
  );
}
