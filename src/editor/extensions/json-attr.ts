/** An attribute's name in HTML: `data-test-point` for testPoint. */
const dataName = (key: string) => `data-${key.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`;

/** parseHTML/renderHTML for an attribute holding JSON (objects survive copy and paste as data-* text). */
export function jsonAttribute<T>(key: string, fallback: () => T) {
  return {
    default: fallback(),
    parseHTML: (element: HTMLElement): T => {
      const raw = element.getAttribute(dataName(key));
      if (!raw) return fallback();
      try {
        return JSON.parse(raw) as T;
      } catch {
        return fallback();
      }
    },
    renderHTML: (attrs: Record<string, unknown>) => ({ [dataName(key)]: JSON.stringify(attrs[key]) }),
  };
}

/** parseHTML/renderHTML for a plain string attribute kept in data-*. */
export function textAttribute(key: string, fallback = '') {
  return {
    default: fallback,
    parseHTML: (element: HTMLElement) => element.getAttribute(dataName(key)) ?? fallback,
    renderHTML: (attrs: Record<string, unknown>) => ({ [dataName(key)]: String(attrs[key] ?? fallback) }),
  };
}
