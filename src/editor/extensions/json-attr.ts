/** parseHTML/renderHTML for an attribute holding JSON (objects survive copy and paste as data-* text). */
export function jsonAttribute<T>(name: string, fallback: () => T) {
  return {
    default: fallback(),
    parseHTML: (element: HTMLElement): T => {
      const raw = element.getAttribute(`data-${name}`);
      if (!raw) return fallback();
      try {
        return JSON.parse(raw) as T;
      } catch {
        return fallback();
      }
    },
    renderHTML: (attrs: Record<string, unknown>) => ({ [`data-${name}`]: JSON.stringify(attrs[name]) }),
  };
}

/** parseHTML/renderHTML for a plain string attribute kept in data-*. */
export function textAttribute(name: string, fallback = '') {
  return {
    default: fallback,
    parseHTML: (element: HTMLElement) => element.getAttribute(`data-${name}`) ?? fallback,
    renderHTML: (attrs: Record<string, unknown>) => ({ [`data-${name}`]: String(attrs[name] ?? fallback) }),
  };
}
