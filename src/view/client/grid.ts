// view stage (page script): a grid of cards of one height that puts in the document only the cards near
// the window's view, so ten thousand entries cost what a screenful costs. The grid is a listbox: focus
// stays on it and aria-activedescendant names the active card, so cards can come and go as it scrolls.

import type { ViewRow } from '../query.ts';

/** Cards drawn above and below the view, in rows. */
const OVERSCAN_ROWS = 2;

/** What a grid asks of its page. */
export interface GridHooks {
  /** Fill a new card element for a row (its position, class and data attributes are the grid's). */
  fill(card: HTMLElement, row: ViewRow): void;
  /** The row was chosen (Enter, a click). */
  choose(row: ViewRow): void;
  /** The row was picked for comparison, or given up (Space). */
  pick(row: ViewRow): void;
  /** Whether the row is the open one, and whether it is picked. */
  isChosen(row: ViewRow): boolean;
  isPicked(row: ViewRow): boolean;
}

/** A virtualised grid of cards in a listbox element. */
export class CardGrid {
  readonly element: HTMLElement;
  private readonly hooks: GridHooks;
  private rows: ViewRow[] = [];
  private readonly cards = new Map<number, HTMLElement>();
  private columns = 1;
  private cardWidth = 0;
  private rowHeight = 0;
  private active = 0;
  private cardHeight = 0;
  private measuredRem = 0;
  private measuredWidth = -1;

  constructor(element: HTMLElement, hooks: GridHooks) {
    this.element = element;
    this.hooks = hooks;
    element.addEventListener('keydown', (event) => this.onKey(event));
    element.addEventListener('focus', () => this.showActive(false));
  }

  /** Show these rows, in this order. */
  setRows(rows: ViewRow[]): void {
    this.rows = rows;
    for (const card of this.cards.values()) card.remove();
    this.cards.clear();
    this.active = Math.min(this.active, Math.max(0, rows.length - 1));
    this.update();
  }

  /** The rows shown, in order. */
  shown(): readonly ViewRow[] {
    return this.rows;
  }

  /** Re-fill the cards in the document (after a choice or a pick changed their look). */
  refresh(): void {
    for (const card of this.cards.values()) card.remove();
    this.cards.clear();
    this.update();
  }

  /** Lay the grid out for its width and put in the cards near the view. */
  update(): void {
    const rem = Number.parseFloat(getComputedStyle(document.documentElement).fontSize) || 16;
    const gap = 0.75 * rem;
    const width = this.element.clientWidth;
    // a card's height is measured again only when the text size or the width changed (a probe forces a layout)
    if (rem !== this.measuredRem || width !== this.measuredWidth) {
      this.cardHeight = this.cardHeightPx();
      this.measuredRem = rem;
      this.measuredWidth = width;
    }
    const probe = this.cardHeight;
    this.columns = Math.max(1, Math.floor((width + gap) / (13 * rem + gap)));
    this.cardWidth = (width - gap * (this.columns - 1)) / this.columns;
    this.rowHeight = probe + gap;
    const rowCount = Math.ceil(this.rows.length / this.columns);
    this.element.style.height = `${Math.max(0, rowCount * this.rowHeight - gap)}px`;
    // which rows are near the view: the grid's top is where the window's view starts, less the scroll
    const top = this.element.getBoundingClientRect().top;
    const first = Math.max(0, Math.floor(-top / this.rowHeight) - OVERSCAN_ROWS);
    const last = Math.min(rowCount - 1, Math.ceil((window.innerHeight - top) / this.rowHeight) + OVERSCAN_ROWS);
    const from = first * this.columns;
    const to = Math.min(this.rows.length, (last + 1) * this.columns);
    for (const [i, card] of this.cards) {
      if (i < from || i >= to) {
        card.remove();
        this.cards.delete(i);
      }
    }
    for (let i = from; i < to; i++) {
      let card = this.cards.get(i);
      if (card === undefined) {
        card = this.makeCard(i);
        this.cards.set(i, card);
        this.element.append(card);
      }
      card.style.width = `${this.cardWidth}px`;
      card.style.transform = `translate(${(i % this.columns) * (this.cardWidth + gap)}px, ${Math.floor(i / this.columns) * this.rowHeight}px)`;
    }
    this.markActive();
  }

  /** Make row `key`'s card the active one, scroll it into view and focus the grid. */
  reveal(key: string, focus: boolean): boolean {
    const i = this.rows.findIndex((row) => row.facts.key === key);
    if (i === -1) return false;
    this.active = i;
    this.showActive(true);
    if (focus) this.element.focus({ preventScroll: true });
    return true;
  }

  private cardHeightPx(): number {
    const probe = document.createElement('div');
    probe.className = 'card';
    probe.style.visibility = 'hidden';
    this.element.append(probe);
    const h = probe.getBoundingClientRect().height;
    probe.remove();
    return h;
  }

  private makeCard(i: number): HTMLElement {
    const row = this.rows[i];
    const card = document.createElement('div');
    card.className = 'card';
    card.id = `card-${row.position}`;
    card.setAttribute('role', 'option');
    card.setAttribute('aria-setsize', String(this.rows.length));
    card.setAttribute('aria-posinset', String(i + 1));
    card.setAttribute('aria-selected', String(this.hooks.isChosen(row)));
    card.dataset.code = row.entry.code;
    card.dataset.key = row.facts.key;
    if (this.hooks.isPicked(row)) card.classList.add('picked');
    this.hooks.fill(card, row);
    card.addEventListener('click', (event) => {
      if ((event.target as HTMLElement).closest('a, input, label') !== null) return;
      this.active = i;
      this.hooks.choose(row);
    });
    return card;
  }

  // scroll the window so the active card is in view (when asked), then mark it
  private showActive(scroll: boolean): void {
    if (this.rows.length === 0) return;
    if (scroll) {
      const top = this.element.getBoundingClientRect().top + Math.floor(this.active / this.columns) * this.rowHeight;
      const bottom = top + this.rowHeight;
      if (top < 0 || bottom > window.innerHeight) window.scrollBy(0, top - Math.max(0, (window.innerHeight - this.rowHeight) / 2));
      this.update();
    }
    this.markActive();
  }

  private markActive(): void {
    const row = this.rows[this.active];
    for (const card of this.cards.values()) card.classList.remove('active');
    if (row === undefined) {
      this.element.removeAttribute('aria-activedescendant');
      return;
    }
    const card = this.cards.get(this.active);
    if (card === undefined) return;
    card.classList.add('active');
    this.element.setAttribute('aria-activedescendant', card.id);
  }

  private onKey(event: KeyboardEvent): void {
    if (this.rows.length === 0) return;
    const pageRows = Math.max(1, Math.floor(window.innerHeight / this.rowHeight) - 1);
    const moves: Record<string, number> = {
      ArrowRight: 1, ArrowLeft: -1, ArrowDown: this.columns, ArrowUp: -this.columns,
      PageDown: pageRows * this.columns, PageUp: -pageRows * this.columns,
      Home: -this.rows.length, End: this.rows.length,
    };
    const move = moves[event.key];
    if (move !== undefined) {
      event.preventDefault();
      this.active = Math.min(this.rows.length - 1, Math.max(0, this.active + move));
      this.showActive(true);
    } else if (event.key === 'Enter') {
      event.preventDefault();
      this.hooks.choose(this.rows[this.active]);
    } else if (event.key === ' ') {
      event.preventDefault();
      this.hooks.pick(this.rows[this.active]);
    }
  }
}
