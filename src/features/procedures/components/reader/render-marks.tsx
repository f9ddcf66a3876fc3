import type { ReactNode } from 'react';
import type { DocNode } from '@shared/document/schema';

const SAFE_HREF = /^(https?:\/\/|mailto:)/i;

/** Text with its marks as plain elements; links only for http(s) and mailto targets. */
export function renderText(node: DocNode, key: number): ReactNode {
  let out: ReactNode = node.text ?? '';
  for (const mark of node.marks ?? []) {
    switch (mark.type) {
      case 'bold':
        out = <strong>{out}</strong>;
        break;
      case 'italic':
        out = <em>{out}</em>;
        break;
      case 'underline':
        out = <u>{out}</u>;
        break;
      case 'strike':
        out = <s>{out}</s>;
        break;
      case 'code':
        out = <code>{out}</code>;
        break;
      case 'link': {
        const href = String(mark.attrs?.href ?? '');
        if (SAFE_HREF.test(href.trim()))
          out = (
            <a href={href} rel="noopener noreferrer nofollow">
              {out}
            </a>
          );
        break;
      }
    }
  }
  return <span key={key}>{out}</span>;
}
