import { createContext, useContext } from 'react';
import type { ReactNode } from 'react';

export interface InAppLinkProps {
  to: string;
  className?: string;
  children: ReactNode;
}

/** How an in-app link in running text looks: underlined, clay, with a comfortable target. */
export const TEXT_LINK_CLASS = 'inline-flex min-h-tap items-center font-medium text-clay-700 underline underline-offset-2 hover:text-clay-800';

/** Draws an in-app link: the router's, or the sign-in page's own. */
export type RenderInAppLink = (props: InAppLinkProps) => ReactNode;

const InAppLinkContext = createContext<RenderInAppLink | null>(null);

/**
 * Which link the pages around sign-in render: the router's link once the app runs, or the sign-in
 * page's own one before the router has loaded (it loads the app and opens the address). Without
 * either, a plain link.
 */
export const InAppLinkProvider = InAppLinkContext.Provider;

/** A link to another page of the app, for pieces shown both before and after the router loads. */
export function InAppLink({ to, className, children }: InAppLinkProps) {
  const render = useContext(InAppLinkContext);
  if (render) return render({ to, className, children });
  return (
    <a href={to} className={className}>
      {children}
    </a>
  );
}
