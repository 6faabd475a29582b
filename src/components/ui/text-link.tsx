import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { TEXT_LINK_CLASS } from './in-app-link';

interface TextLinkProps {
  to: string;
  children: ReactNode;
  className?: string;
}

/** An in-app link that reads as a link: underlined, clay, with a comfortable target. */
export function TextLink({ to, children, className = '' }: TextLinkProps) {
  return (
    <Link to={to} className={`${TEXT_LINK_CLASS} ${className}`}>
      {children}
    </Link>
  );
}
