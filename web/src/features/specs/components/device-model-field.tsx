/**
 * The spec form's `deviceModel` field: a choice of the project's device-library cards (a page
 * of them, found by part of a name) that fills the transistor model (IS, BF, VAF and `device.model`) and records
 * the card in the spec; the recorded card in words, with its state when it has since been
 * replaced by a new text or removed from the library (its text as recorded, on demand). The
 * form applies the choice (lib/device-choice.ts).
 */
import type { FieldProps } from '@rjsf/utils';
import { useId } from 'react';
import { formatQuantity } from '#shared/units/format-quantity';
import { formatDate } from '../../../lib/dates';
import { inputClass } from '../../../components/forms/input-class';
import { DEVICE_PICKER_PAGE_SIZE, type LibraryDevice, type RecordedDeviceModel } from '../../../lib/device-library';
import { libraryDeviceFor, refFor, type DeviceChoiceContext, type DeviceLibraryState, type DeviceModelRef } from '../lib/device-choice';
import type { PnpChoiceContext } from '../lib/pnp-choice';

const NOTE = 'mt-1 text-xs leading-snug text-ink-soft dark:text-night-ink-soft';

function summary(device: LibraryDevice): string {
  const vaf = device.device.earlyVoltageV === 0 ? 'no VAF' : `VAF ${formatQuantity(device.device.earlyVoltageV, 'V')}`;
  // Names are unique in a project's library, so the file is left to the note below (the column is narrow).
  return `${device.name} — IS ${formatQuantity(device.device.saturationCurrentA, 'A')}, BF ${device.device.beta}, ${vaf}`;
}

const day = (iso: string | null) => (iso ? formatDate(iso) : 'an earlier date');

/** What became of the recorded card, in words (null while it is in the library as recorded). */
function recordedState(recorded: DeviceModelRef, resolved: DeviceLibraryState['recorded']): string | null {
  if (resolved === null || resolved === 'loading') return null;
  const card = resolved.recorded;
  if (!card) return `Card ${recorded.name} is not in this project's library from that file (sha256 ${recorded.checksum.slice(0, 12)}…): the spec's values stand on their own.`;
  if (card.state === 'library') return null;
  const how = card.state === 'replaced' ? 'replaced by a new text' : 'removed from the library';
  const now = resolved.current ? ` The library's ${resolved.current.name} today is from ${resolved.current.fileName}; choose it to fill IS, BF and VAF from the new text.` : '';
  return `Filled from ${card.name} of ${card.fileName} (sha256 ${card.checksum.slice(0, 12)}…), since ${how} on ${day(card.retiredAt)}${card.retiredBy ? ` by ${card.retiredBy.displayName}` : ''}.${now}`;
}

/** The recorded card's text as the spec was filled from it, when it is no longer the library's. */
function RecordedText({ resolved }: { resolved: RecordedDeviceModel }) {
  const card = resolved.recorded;
  if (!card || card.state === 'library') return null;
  return (
    <details className={NOTE}>
      <summary className="cursor-pointer">The card as the spec was filled from it</summary>
      <pre className="mt-1 overflow-x-auto rounded bg-paper p-2 dark:bg-night">{card.card}</pre>
    </details>
  );
}

export function DeviceModelField({ fieldPathId, formData, onChange, readonly, disabled, registry }: FieldProps) {
  const id = fieldPathId.$id;
  const filterId = useId();
  const library = (registry.formContext as DeviceChoiceContext | undefined)?.deviceLibrary;
  const recorded = formData && typeof formData === 'object' && typeof (formData as DeviceModelRef).name === 'string' ? (formData as DeviceModelRef) : undefined;
  const items = (library?.items ?? []).filter((d) => d.state === 'library');
  const chosen = libraryDeviceFor(recorded, items);
  const resolved = library?.recorded ?? null;
  const stateNote = recorded ? recordedState(recorded, resolved) : null;

  const pnpStage = (registry.formContext as PnpChoiceContext | undefined)?.pnpStage === true;
  if (readonly || !library || (pnpStage && !recorded)) {
    if (pnpStage && !recorded && !readonly && library) {
      return (
        <p id={id} className={NOTE}>
          The device library holds NPN cards: a PNP stage’s transistor is typed in below.
        </p>
      );
    }
    if (!recorded) return null;
    return (
      <div id={id}>
        <p className="mb-1 text-sm font-medium">From the device library</p>
        <p className="py-1.5 text-sm">
          Card {recorded.name} <span className="text-ink-soft dark:text-night-ink-soft">(file sha256 {recorded.checksum.slice(0, 12)}…)</span>
        </p>
        {stateNote && <p className={NOTE}>{stateNote}</p>}
        {resolved && resolved !== 'loading' && <RecordedText resolved={resolved} />}
      </div>
    );
  }

  const value = chosen ? String(chosen.id) : recorded ? 'recorded' : '';
  const onSelect = (selected: string) => {
    if (selected === 'recorded') return;
    const device = items.find((d) => String(d.id) === selected);
    onChange(device ? refFor(device) : undefined, fieldPathId.path);
  };
  const recordedGone = resolved !== null && resolved !== 'loading' ? (resolved.recorded?.state ?? 'missing') : 'library';
  const filter = library.filter.trim();
  const more = library.total > DEVICE_PICKER_PAGE_SIZE;
  const searching = filter !== '' || more;
  return (
    <div>
      {searching && (
        <div className="mb-2">
          <label htmlFor={filterId} className="mb-1 block text-xs font-medium">
            Find a library card by name
          </label>
          <input id={filterId} type="search" maxLength={64} value={library.filter} onChange={(e) => library.setFilter(e.target.value)} className={inputClass()} placeholder="FH-N1…" />
        </div>
      )}
      <label htmlFor={id} className="mb-1 block text-sm font-medium">
        Fill from the device library
      </label>
      <select id={id} value={value} disabled={disabled || library.loading} onChange={(e) => onSelect(e.target.value)} className={inputClass()} aria-describedby={`${id}__note`}>
        <option value="">{library.loading ? 'Loading the library…' : 'None: values typed in below'}</option>
        {recorded && !chosen && (
          <option value="recorded" disabled>
            {recorded.name} ({recordedGone === 'replaced' ? 'replaced in the library' : recordedGone === 'removed' ? 'removed from the library' : recordedGone === 'missing' ? 'not in the library' : 'recorded'})
          </option>
        )}
        {items.map((device) => (
          <option key={device.id} value={String(device.id)}>
            {summary(device)}
          </option>
        ))}
      </select>
      <div id={`${id}__note`}>
        {library.error !== null && library.error !== undefined ? (
          <p className={NOTE}>The device library could not be loaded; type the values in below.</p>
        ) : chosen ? (
          <>
            <p className={NOTE}>
              IS, BF, VAF and the full model below come from card {chosen.name} of {chosen.fileName} (sha256 {chosen.checksum.slice(0, 12)}…); changing IS, BF or VAF drops the link to the card
              and its model.
            </p>
            {chosen.notes.length > 0 && (
              <details className={NOTE}>
                <summary className="cursor-pointer">What the engine leaves out of this card (SPICE simulates it)</summary>
                {chosen.notes.map((note) => (
                  <p key={note} className="mt-1">
                    <span aria-hidden="true">! </span>
                    {note}
                  </p>
                ))}
              </details>
            )}
          </>
        ) : stateNote ? (
          <>
            <p className={NOTE}>{stateNote}</p>
            {resolved && resolved !== 'loading' && <RecordedText resolved={resolved} />}
          </>
        ) : !library.loading && library.total === 0 && filter === '' ? (
          <p className={NOTE}>This project’s device library is empty; .model cards are uploaded on the project page.</p>
        ) : (
          <p className={NOTE}>Choosing a card fills IS, BF, VAF and the card’s full transistor model, and records the card with the spec.</p>
        )}
        {more && !library.loading && (
          <p className={NOTE}>
            The first {DEVICE_PICKER_PAGE_SIZE} of {library.total} cards{filter ? ` matching “${filter}”` : ''} by name; type part of a name above to find others.
          </p>
        )}
        {filter !== '' && library.total === 0 && !library.loading && <p className={NOTE}>No library card has “{filter}” in its name.</p>}
      </div>
    </div>
  );
}
