/**
 * The versions of a spec, newest first, with who saved each and when; two radio columns pick
 * the versions to compare ("from" the older, "to" the newer).
 */
import type { SpecVersion } from '../../../lib/api-types';
import { cn } from '../../../lib/cn';
import { When } from './when';

export interface VersionPickerProps {
  versions: readonly SpecVersion[];
  authorName: (userId: number) => string;
  from: number;
  to: number;
  onPick: (from: number, to: number) => void;
}

const RADIO = 'h-4 w-4 accent-fern dark:accent-fern-soft';

export function VersionPicker({ versions, authorName, from, to, onPick }: VersionPickerProps) {
  const newestFirst = [...versions].sort((a, b) => b.version - a.version);
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm">
        <caption className="sr-only">Versions of this spec; pick one to compare from and one to compare to.</caption>
        <thead>
          <tr className="border-b border-rule text-left text-xs tracking-wide text-ink-soft uppercase dark:border-night-rule dark:text-night-ink-soft">
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Version
            </th>
            <th scope="col" className="py-1.5 pr-3 font-medium">
              Saved
            </th>
            <th scope="col" className="w-12 py-1.5 text-center font-medium">
              From
            </th>
            <th scope="col" className="w-12 py-1.5 text-center font-medium">
              To
            </th>
          </tr>
        </thead>
        <tbody>
          {newestFirst.map((v) => {
            const picked = v.version === from || v.version === to;
            return (
              <tr key={v.id} className={cn('border-b border-rule/60 align-top dark:border-night-rule/60', picked && 'bg-fern-soft/40 dark:bg-night')}>
                <th scope="row" className="max-w-56 py-2 pr-3 text-left font-normal">
                  <span className="block font-medium tabular-nums">Version {v.version}</span>
                  <span className="block truncate text-xs text-ink-soft dark:text-night-ink-soft" title={v.title}>
                    {v.title}
                  </span>
                </th>
                <td className="py-2 pr-3">
                  <span className="block">{authorName(v.createdById)}</span>
                  <span className="block text-xs whitespace-nowrap text-ink-soft dark:text-night-ink-soft">
                    <When at={v.createdAt} />
                  </span>
                </td>
                <td className="py-2 text-center">
                  <input type="radio" name="compare-from" className={RADIO} aria-label={`Compare from version ${v.version}`} checked={v.version === from} onChange={() => onPick(v.version, to)} />
                </td>
                <td className="py-2 text-center">
                  <input type="radio" name="compare-to" className={RADIO} aria-label={`Compare to version ${v.version}`} checked={v.version === to} onChange={() => onPick(from, v.version)} />
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
