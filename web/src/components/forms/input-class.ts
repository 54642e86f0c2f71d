import { cn } from '../../lib/cn';

/** Classes of a text input in the forms: compact, a red edge on error; read-only reads as plain text. */
export function inputClass({ invalid = false, readonly = false, large = false }: { invalid?: boolean; readonly?: boolean; large?: boolean } = {}): string {
  return cn(
    'w-full min-w-0 rounded-md border tabular-nums',
    large ? 'py-2 text-base' : 'py-1.5 text-sm',
    readonly
      ? 'border-transparent bg-transparent px-0'
      : ['bg-sheet px-2.5 dark:bg-night', invalid ? 'border-short dark:border-short-bright' : 'border-rule dark:border-night-rule'],
  );
}
