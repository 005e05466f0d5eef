import { el } from './dom.js';

/**
 * Tabs with the keyboard behaviour people expect: Tab reaches the selected tab, the arrow keys,
 * Home and End move between tabs, and each panel is labelled by its tab.
 */
export interface Tab {
  id: string;
  title: string;
  panel: HTMLElement;
}

export interface Tabs {
  element: HTMLElement;
  select(id: string): void;
}

export function tabs(list: Tab[], label: string): Tabs {
  const bar = el('div', { class: 'tabs', attrs: { role: 'tablist', 'aria-label': label } });
  const panels = el('div', { class: 'tab-panels' });
  const buttons = list.map((tab) => {
    const button = el('button', { class: 'tab', text: tab.title, attrs: { type: 'button', role: 'tab', id: `tab-${tab.id}`, 'aria-controls': `panel-${tab.id}` }, data: { tab: tab.id } });
    const panel = el('div', { class: 'tab-panel', attrs: { role: 'tabpanel', id: `panel-${tab.id}`, 'aria-labelledby': `tab-${tab.id}`, tabindex: '0' } }, tab.panel);
    bar.appendChild(button);
    panels.appendChild(panel);
    return { tab, button, panel };
  });

  const select = (id: string, focus = false) => {
    for (const b of buttons) {
      const on = b.tab.id === id;
      b.button.setAttribute('aria-selected', String(on));
      b.button.tabIndex = on ? 0 : -1;
      b.panel.hidden = !on;
      if (on && focus) b.button.focus();
    }
    panels.scrollTop = 0;
  };

  buttons.forEach((b, i) => {
    b.button.addEventListener('click', () => select(b.tab.id));
    b.button.addEventListener('keydown', (event) => {
      const last = buttons.length - 1;
      const to = event.key === 'ArrowRight' ? (i === last ? 0 : i + 1) : event.key === 'ArrowLeft' ? (i === 0 ? last : i - 1) : event.key === 'Home' ? 0 : event.key === 'End' ? last : -1;
      if (to < 0) return;
      event.preventDefault();
      select(buttons[to]!.tab.id, true);
    });
  });
  select(list[0]!.id);
  return { element: el('div', { class: 'tab-box' }, bar, panels), select: (id) => select(id) };
}
