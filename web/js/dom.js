// Building the page's DOM. Every string from data goes in as a text node (textContent), never as
// markup, so gazetteer names and locality text that contain markup are shown as the text they are.

/**
 * el('td', { class: 'num' }, '12 m') → <td class="num">12 m</td>. Attributes are set one by one;
 * children are nodes or strings (strings become text nodes). `on*` keys take listener functions.
 */
export function el(tag, attributes = {}, ...children) {
  const node = document.createElement(tag);
  for (const [name, value] of Object.entries(attributes)) {
    if (value === undefined || value === null || value === false) continue;
    if (name.startsWith('on') && typeof value === 'function') node.addEventListener(name.slice(2), value);
    else if (name === 'dataset') Object.assign(node.dataset, value);
    else node.setAttribute(name, value === true ? '' : String(value));
  }
  append(node, children);
  return node;
}

function append(node, children) {
  for (const child of children.flat()) {
    if (child === undefined || child === null || child === false) continue;
    node.append(child instanceof Node ? child : document.createTextNode(String(child)));
  }
}

/** Replaces a node's children. */
export function fill(node, ...children) {
  node.replaceChildren();
  append(node, children);
  return node;
}

/** A two-column table of label → value rows; rows whose value is empty are left out. */
export function definitionTable(caption, rows, className = 'pairs') {
  const body = rows
    .filter(([, value]) => value !== undefined && value !== null && value !== '')
    .map(([label, value]) => el('tr', {}, el('th', { scope: 'row' }, label), el('td', {}, value)));
  return el('table', { class: className }, el('caption', {}, caption), el('tbody', {}, body));
}

/** Meters for a person: whole meters, written as coordinateUncertaintyInMeters is (no grouping), so the two read alike. */
export function meters(value) {
  return `${Math.round(value)} m`;
}

/** Copies text to the clipboard, saying so in `status`; where the clipboard is refused, selects `area` for Ctrl+C. */
export async function copyText(text, status, area) {
  try {
    await navigator.clipboard.writeText(text);
    status.textContent = 'copied';
  } catch {
    area?.select();
    status.textContent = area ? 'selected: press Ctrl+C to copy' : 'the clipboard is not available here: use Download';
  }
}

/** Starts a download of text as a file, built in memory (no server round trip, no data URL in markup). */
export function download(filename, type, text) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const link = el('a', { href: url, download: filename, hidden: true });
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}
