import { Link } from '@tiptap/extension-link';

const ALLOWED = /^(https?:\/\/|mailto:)/i;

/**
 * Links limited to http(s) and mailto, without the title attribute the stock mark adds: the
 * document schema accepts exactly href, target, rel and class.
 */
export const SafeLink = Link.extend({
  addAttributes() {
    const { title: _title, ...rest } = (this.parent?.() ?? {}) as Record<string, unknown>;
    return rest as ReturnType<NonNullable<typeof this.parent>>;
  },
}).configure({
  openOnClick: false,
  autolink: true,
  defaultProtocol: 'https',
  protocols: [],
  isAllowedUri: (url) => ALLOWED.test(url.trim()),
  HTMLAttributes: { target: null, rel: 'noopener noreferrer nofollow', class: null },
});
