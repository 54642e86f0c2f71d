import { cn } from '../../lib/cn';
import { passwordStrength } from '../../lib/password-strength';

const BAR = ['bg-short', 'bg-note', 'bg-fern', 'bg-holds'];
const TEXT = ['text-short dark:text-short-bright', 'text-note dark:text-note-bright', 'text-fern dark:text-fern-bright', 'text-holds dark:text-holds-bright'];

/** The password's strength in words, with a three-step bar that only repeats what the words say. */
export function PasswordHint({ password }: { password: string }) {
  if (password === '') return <>A few unrelated words make a good one.</>;
  const strength = passwordStrength(password);
  return (
    <span className="flex items-center gap-2" aria-live="polite">
      <span aria-hidden="true" className="flex gap-0.5">
        {[1, 2, 3].map((step) => (
          <span key={step} className={cn('h-1.5 w-6 rounded-full', strength.level >= step ? BAR[strength.level] : 'bg-rule dark:bg-night-rule')} />
        ))}
      </span>
      <span className={TEXT[strength.level]}>{strength.words}</span>
    </span>
  );
}
