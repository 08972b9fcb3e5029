import { useEffect, useLayoutEffect, useRef, useState, type MouseEvent } from 'react';
import { Notice } from '@/components/ui/notice';
import type { FieldErrors } from '@/lib/forms/field-errors';

export interface SummaryItem {
  path: string;
  label: string | null;
  message: string;
  /** The control the item links to, when it is on the page. */
  target: HTMLElement | null;
}

/** A person's name for a field path, given the label the field has on the page; null to keep that label. */
export type LabelFor = (path: string, label: string | null) => string | null;

const attr = (value: string) => value.replace(/["\\]/g, '\\$&');

/**
 * The control that shows a field: its `name`, or a `data-field` on a control group (radios, a drawn
 * region); for a part of a field without a control of its own (`region.points`), the field's control.
 */
export function fieldElement(root: ParentNode, path: string): HTMLElement | null {
  for (let at = path; at !== ''; at = at.includes('.') ? at.slice(0, at.lastIndexOf('.')) : '') {
    const found = root.querySelector<HTMLElement>(`[name="${attr(at)}"]`) ?? root.querySelector<HTMLElement>(`[data-field="${attr(at)}"]`);
    if (found) return found;
  }
  return null;
}

/** The words a control is labelled with on the page. */
function labelText(element: HTMLElement): string | null {
  const labels = (element as HTMLInputElement).labels;
  if (labels && labels.length > 0) return labels[0]!.textContent?.trim() || null;
  const own = element.getAttribute('aria-label') ?? element.getAttribute('data-label');
  if (own) return own;
  const by = element.getAttribute('aria-labelledby');
  if (by) return document.getElementById(by.split(' ')[0]!)?.textContent?.trim() || null;
  return null;
}

/**
 * The problems of a form as the summary lists them: each field once, the whole form's problem first,
 * then the fields in the order they stand on the page (fields not on the page last).
 */
export function summaryItems(errors: FieldErrors, root: ParentNode, labelFor?: LabelFor): SummaryItem[] {
  const items = Object.entries(errors)
    .filter(([, message]) => message)
    .map(([path, message]): SummaryItem => {
      const target = path === '' ? null : fieldElement(root, path);
      const own = target ? labelText(target) : null;
      return { path, message, target, label: path === '' ? null : (labelFor?.(path, own) ?? own) };
    });
  const rank = (item: SummaryItem) => (item.path === '' ? 0 : item.target ? 1 : 2);
  return items
    .map((item, index) => ({ item, index }))
    .sort((a, b) => {
      const byRank = rank(a.item) - rank(b.item);
      if (byRank !== 0) return byRank;
      if (a.item.target && b.item.target && a.item.target !== b.item.target) {
        return a.item.target.compareDocumentPosition(b.item.target) & Node.DOCUMENT_POSITION_FOLLOWING ? -1 : 1;
      }
      return a.index - b.index;
    })
    .map(({ item }) => item);
}

export interface ErrorSummaryProps {
  errors: FieldErrors;
  /** A person's name for a field path, where the field's own label is not enough ("Observation 2 · Severity"). */
  labelFor?: LabelFor;
  /** Takes focus each time this number grows (after a refused submit). */
  focusRequest?: number;
}

/**
 * The one list of a form's problems: in form order, each field once, each a link that puts focus
 * on the field. It takes focus after a refused submit, so a screen reader hears it first.
 */
export function ErrorSummary({ errors, labelFor, focusRequest = 0 }: ErrorSummaryProps) {
  const ref = useRef<HTMLDivElement>(null);
  const [items, setItems] = useState<SummaryItem[]>([]);
  const signature = JSON.stringify(errors);

  useLayoutEffect(() => {
    const root = ref.current?.closest('form') ?? document;
    setItems(summaryItems(errors, root, labelFor));
    // Recomputed when the problems change; labels and order come from the page as it is then.
  }, [signature]); // eslint-disable-line react-hooks/exhaustive-deps

  useEffect(() => {
    if (focusRequest > 0) ref.current?.focus();
  }, [focusRequest]);

  function go(event: MouseEvent<HTMLAnchorElement>, target: HTMLElement) {
    event.preventDefault();
    target.scrollIntoView?.({ block: 'center' });
    target.focus();
  }

  const fields = items.filter((item) => item.path !== '').length;
  return (
    <div ref={ref} tabIndex={-1} className="outline-none empty:hidden">
      {items.length > 0 ? (
        <Notice tone="error" role="alert" title={fields === 0 ? 'Not saved.' : `Not saved: ${fields === 1 ? 'one field needs' : `${fields} fields need`} attention.`}>
          <ul className="mt-1 list-disc pl-5">
            {items.map((item) => (
              <li key={item.path}>
                {item.target ? (
                  <a href={item.target.id ? `#${item.target.id}` : '#'} className="text-danger-700" onClick={(event) => go(event, item.target!)}>
                    {item.label ? `${item.label}: ` : ''}
                    {item.message}
                  </a>
                ) : (
                  <>
                    {item.label ? `${item.label}: ` : ''}
                    {item.message}
                  </>
                )}
              </li>
            ))}
          </ul>
        </Notice>
      ) : null}
    </div>
  );
}
