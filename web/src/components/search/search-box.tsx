/**
 * The navigation's search box: `/` anywhere outside a field brings the cursor here; typing asks
 * the search (once typing pauses) and lists the first few hits of each kind under the box; the
 * arrow keys move through them, Enter opens the one chosen (or, with none chosen, the results
 * page), Escape clears the box (and, when it is empty, leaves it). A combobox with a grouped
 * listbox for assistive technology, and a live line saying how much was found.
 */
import { useQuery, useSuspenseQuery } from '@tanstack/react-query';
import { useEffect, useId, useRef, useState, type KeyboardEvent, type RefObject } from 'react';
import { useLocation, useNavigate } from 'react-router-dom';
import { SEARCH_KINDS, SEARCH_QUERY_MAX_LENGTH, type SearchAnswer } from '#shared/api/search';
import { paths } from '../../config/paths';
import { meQuery } from '../../lib/auth-queries';
import { cn } from '../../lib/cn';
import { hitHref, SEARCH_KIND_WORDS, SEARCH_PAUSE_MS, searchHref, searchQuery } from '../../lib/search-queries';
import { HitSummary } from './hit-summary';

/** Hits of each kind the box lists (four kinds of three fit under the box on a phone without a scrolling list). */
const BOX_PAGE = 3;

/** Whether a key press lands in something that takes typing (where `/` is a character, not a shortcut). */
function typingInto(target: EventTarget | null): boolean {
  if (!(target instanceof HTMLElement)) return false;
  return target.isContentEditable || target instanceof HTMLInputElement || target instanceof HTMLTextAreaElement || target instanceof HTMLSelectElement;
}

/** `/` outside a field puts the cursor in the box. */
function useSlashFocus(input: RefObject<HTMLInputElement | null>) {
  useEffect(() => {
    const onKey = (event: globalThis.KeyboardEvent) => {
      if (event.key !== '/' || event.ctrlKey || event.metaKey || event.altKey || event.defaultPrevented || typingInto(event.target)) return;
      event.preventDefault();
      input.current?.focus();
      input.current?.select();
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, [input]);
}

/** What the live line says about an answer. */
function foundSentence(answer: SearchAnswer | undefined, asked: string): string {
  if (!answer || asked === '') return '';
  const parts = SEARCH_KINDS.filter((kind) => answer.counts[kind] > 0).map((kind) => SEARCH_KIND_WORDS[kind].count(answer.counts[kind]));
  return parts.length ? `Found ${parts.join(', ')}. Arrow keys move through them.` : `Nothing found for “${asked}”.`;
}

export function SearchBox() {
  const { data: user } = useSuspenseQuery(meQuery());
  const navigate = useNavigate();
  const location = useLocation();
  const input = useRef<HTMLInputElement>(null);
  const id = useId();
  const listId = `${id}-list`;
  const [text, setText] = useState(() => (location.pathname === paths.search.path ? (new URLSearchParams(location.search).get('q') ?? '') : ''));
  const [asked, setAsked] = useState(text.trim());
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(-1);
  useSlashFocus(input);

  useEffect(() => {
    const pause = setTimeout(() => setAsked(text.trim()), SEARCH_PAUSE_MS);
    return () => clearTimeout(pause);
  }, [text]);
  useEffect(() => setActive(-1), [asked]);
  // Another page: the list closes.
  useEffect(() => {
    setOpen(false);
    setActive(-1);
  }, [location.pathname, location.search]);

  const answer = useQuery({ ...searchQuery({ q: asked, pageSize: BOX_PAGE }), enabled: open && asked !== '' });
  const current = answer.data && !answer.isPlaceholderData ? answer.data : undefined;
  const groups = current?.groups ?? [];
  const total = current ? SEARCH_KINDS.reduce((sum, kind) => sum + current.counts[kind], 0) : 0;
  /** The options in order: every hit listed, then the results page (null). */
  const options = [...groups.flatMap((group) => group.items.map((hit) => ({ id: `${id}-${hit.kind}-${hit.id}`, hit }))), { id: `${id}-all`, hit: null }];
  const listed = open && current !== undefined && total > 0;
  const activeId = listed && active >= 0 ? (options[active]?.id ?? null) : null;
  // The chosen option in view (the list is long on a small screen).
  useEffect(() => {
    if (activeId) document.getElementById(activeId)?.scrollIntoView?.({ block: 'nearest' });
  }, [activeId]);
  if (!user) return null;
  const hrefOf = (option: (typeof options)[number]) => (option.hit ? hitHref(option.hit, user) : searchHref(asked));

  /** Opens a page; the box keeps its text only for the results page, which shows that query. */
  const go = (href: string) => {
    setOpen(false);
    setActive(-1);
    input.current?.blur();
    if (!href.startsWith(paths.search.path)) {
      setText('');
      setAsked('');
    }
    navigate(href);
  };
  const onKeyDown = (event: KeyboardEvent<HTMLInputElement>) => {
    if (event.key === 'ArrowDown' || event.key === 'ArrowUp') {
      event.preventDefault();
      setOpen(true);
      if (!listed) return;
      const step = event.key === 'ArrowDown' ? 1 : -1;
      setActive((at) => (at === -1 && step < 0 ? options.length - 1 : (at + step + options.length) % options.length));
    } else if (event.key === 'Enter') {
      event.preventDefault();
      if (activeId) go(hrefOf(options[active]));
      else if (text.trim() !== '') go(searchHref(text.trim()));
    } else if (event.key === 'Escape') {
      event.preventDefault();
      if (text !== '') {
        setText('');
        setAsked('');
      } else input.current?.blur();
      setOpen(false);
      setActive(-1);
    }
  };

  const optionClass = (optionId: string) =>
    cn('cursor-pointer px-3 py-1.5', activeId === optionId ? 'bg-fern-soft dark:bg-night' : 'hover:bg-paper dark:hover:bg-night/60');
  return (
    <form role="search" aria-label="Projects, specs, proposals and people" className="relative order-last w-full sm:order-none sm:w-60 lg:w-72" onSubmit={(event) => event.preventDefault()}>
      <label htmlFor={`${id}-input`} className="sr-only">
        Search projects, specs, proposals and people
      </label>
      <input
        ref={input}
        id={`${id}-input`}
        type="search"
        role="combobox"
        aria-expanded={listed}
        aria-controls={listed ? listId : undefined}
        aria-autocomplete="list"
        aria-activedescendant={activeId ?? undefined}
        autoComplete="off"
        spellCheck={false}
        maxLength={SEARCH_QUERY_MAX_LENGTH}
        placeholder="Search"
        value={text}
        onChange={(event) => {
          setText(event.target.value);
          setOpen(true);
        }}
        onFocus={() => setOpen(true)}
        onBlur={() => setOpen(false)}
        onKeyDown={onKeyDown}
        className="peer w-full rounded-md border border-rule bg-sheet py-1 pr-8 pl-2.5 text-sm placeholder:text-ink-soft dark:border-night-rule dark:bg-night dark:placeholder:text-night-ink-soft"
      />
      <kbd
        aria-hidden="true"
        className="pointer-events-none absolute top-1/2 right-2 -translate-y-1/2 rounded-sm border border-rule px-1 font-mono text-xs text-ink-soft peer-focus:hidden dark:border-night-rule dark:text-night-ink-soft"
      >
        /
      </kbd>
      <p aria-live="polite" className="sr-only">
        {open ? foundSentence(current, asked) : ''}
      </p>
      {open && current !== undefined && asked !== '' && (
        <div className="absolute top-full left-0 z-30 mt-1 w-full rounded-md border border-rule bg-sheet py-1 shadow-lg sm:w-[28rem] dark:border-night-rule dark:bg-night-sheet">
          {listed ? (
            <div id={listId} role="listbox" aria-label="Search results">
              {groups.map((group) => (
                <div key={group.kind} role="group" aria-label={`${SEARCH_KIND_WORDS[group.kind].title}: ${group.total}`} className="border-b border-rule/70 pb-1 last:border-b-0 dark:border-night-rule/70">
                  <div role="presentation" className="flex items-baseline justify-between px-3 pt-1.5 pb-0.5 text-xs font-medium tracking-wide text-ink-soft uppercase dark:text-night-ink-soft">
                    {SEARCH_KIND_WORDS[group.kind].title}
                    <span className="tabular-nums">{group.total}</span>
                  </div>
                  {group.items.map((hit) => {
                    const optionId = `${id}-${hit.kind}-${hit.id}`;
                    return (
                      <div
                        key={optionId}
                        id={optionId}
                        role="option"
                        aria-selected={activeId === optionId}
                        className={optionClass(optionId)}
                        onMouseDown={(event) => event.preventDefault()}
                        onClick={() => go(hitHref(hit, user))}
                      >
                        <HitSummary hit={hit} compact />
                      </div>
                    );
                  })}
                </div>
              ))}
              <div
                id={`${id}-all`}
                role="option"
                aria-selected={activeId === `${id}-all`}
                className={cn(optionClass(`${id}-all`), 'text-sm text-fern dark:text-fern-bright')}
                onMouseDown={(event) => event.preventDefault()}
                onClick={() => go(searchHref(asked))}
              >
                {total === 1 ? 'Open the results page' : `All ${total} results`} for “{asked}” <span aria-hidden="true">→</span>
              </div>
            </div>
          ) : (
            <p className="px-3 py-2 text-sm text-ink-soft dark:text-night-ink-soft">Nothing found for “{asked}”.</p>
          )}
        </div>
      )}
    </form>
  );
}
