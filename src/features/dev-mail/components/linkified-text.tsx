import { Fragment } from 'react';
import { linkClasses } from '@/components/ui/text-link';

const URL_PATTERN = /(https?:\/\/[^\s<>"')\]]+)/g;

/** Plain mail text with its http(s) links made clickable; nothing else is interpreted. */
export function LinkifiedText({ text }: { text: string }) {
  const parts = text.split(URL_PATTERN);
  return (
    <pre className="font-sans text-sm break-words whitespace-pre-wrap text-canvas-900">
      {parts.map((part, index) => {
        if (index % 2 === 0) return <Fragment key={index}>{part}</Fragment>;
        // Links to this app open here (invitations, password resets); others in a new tab.
        const sameOrigin = part.startsWith(window.location.origin);
        return (
          <a key={index} href={part} className={`${linkClasses} break-all`} {...(sameOrigin ? {} : { target: '_blank', rel: 'noreferrer' })}>
            {part}
          </a>
        );
      })}
    </pre>
  );
}
