/**
 * The spec form's `deviceModel` field: a choice of the project's device-library cards that
 * fills the transistor model (IS, BF, VAF) and records the card in the spec; read-only, the
 * recorded card in words. The form applies the choice (lib/device-choice.ts).
 */
import type { FieldProps } from '@rjsf/utils';
import { formatQuantity } from '../../../../../shared/units/format-quantity';
import { inputClass } from '../../../components/forms/input-class';
import type { LibraryDevice } from '../../devices/api/device-queries';
import { libraryDeviceFor, refFor, type DeviceChoiceContext, type DeviceModelRef } from '../lib/device-choice';

const NOTE = 'mt-1 text-xs leading-snug text-ink-soft dark:text-night-ink-soft';

function summary(device: LibraryDevice): string {
  const vaf = device.device.earlyVoltageV === 0 ? 'no VAF' : `VAF ${formatQuantity(device.device.earlyVoltageV, 'V')}`;
  // Names are unique in a project's library, so the file is left to the note below (the column is narrow).
  return `${device.name} — IS ${formatQuantity(device.device.saturationCurrentA, 'A')}, BF ${device.device.beta}, ${vaf}`;
}

export function DeviceModelField({ fieldPathId, formData, onChange, readonly, disabled, registry }: FieldProps) {
  const id = fieldPathId.$id;
  const library = (registry.formContext as DeviceChoiceContext | undefined)?.deviceLibrary;
  const recorded = formData && typeof formData === 'object' && typeof (formData as DeviceModelRef).name === 'string' ? (formData as DeviceModelRef) : undefined;
  const items = library?.items ?? [];
  const chosen = libraryDeviceFor(recorded, library?.items);

  if (readonly || !library) {
    if (!recorded) return null;
    return (
      <div id={id}>
        <p className="mb-1 text-sm font-medium">From the device library</p>
        <p className="py-1.5 text-sm">
          Card {recorded.name} <span className="text-ink-soft dark:text-night-ink-soft">(file sha256 {recorded.checksum.slice(0, 12)}…)</span>
        </p>
      </div>
    );
  }

  const value = chosen ? String(chosen.id) : recorded ? 'recorded' : '';
  const onSelect = (selected: string) => {
    if (selected === 'recorded') return;
    const device = items.find((d) => String(d.id) === selected);
    onChange(device ? refFor(device) : undefined, fieldPathId.path);
  };
  return (
    <div>
      <label htmlFor={id} className="mb-1 block text-sm font-medium">
        Fill from the device library
      </label>
      <select id={id} value={value} disabled={disabled || library.loading} onChange={(e) => onSelect(e.target.value)} className={inputClass()} aria-describedby={`${id}__note`}>
        <option value="">{library.loading ? 'Loading the library…' : 'None: values typed in below'}</option>
        {recorded && !chosen && (
          <option value="recorded" disabled>
            {recorded.name} (no longer in the library)
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
              IS, BF and VAF below come from card {chosen.name} of {chosen.fileName} (sha256 {chosen.checksum.slice(0, 12)}…); changing one of them drops the link to the card.
            </p>
            {chosen.notes.length > 0 && (
              <details className={NOTE}>
                <summary className="cursor-pointer">What the estimates leave out of this card</summary>
                {chosen.notes.map((note) => (
                  <p key={note} className="mt-1">
                    <span aria-hidden="true">! </span>
                    {note}
                  </p>
                ))}
              </details>
            )}
          </>
        ) : !library.loading && items.length === 0 ? (
          <p className={NOTE}>This project’s device library is empty; .model cards are uploaded on the project page.</p>
        ) : (
          <p className={NOTE}>Choosing a card fills IS, BF and VAF and records the card with the spec.</p>
        )}
      </div>
    </div>
  );
}
