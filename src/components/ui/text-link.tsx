import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';

interface TextLinkProps {
  to: string;
  children: ReactNode;
  className?: string;
}

/** An in-app link that reads as a link: underlined, clay, with a comfortable target. */
export function TextLink({ to, children, className = '' }: TextLinkProps) {
  return (
    <Link to={to} className={`inline-flex min-h-tap items-center font-medium text-clay-700 underline underline-offset-2 hover:text-clay-800 ${className}`}>
      {children}
    </Link>
  );
}
