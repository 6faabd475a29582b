import Boxes from 'lucide-react/icons/boxes';
import Building2 from 'lucide-react/icons/building-2';
import ClipboardList from 'lucide-react/icons/clipboard-list';
import FileQuestionMark from 'lucide-react/icons/file-question-mark';
import Forklift from 'lucide-react/icons/forklift';
import House from 'lucide-react/icons/house';
import MapPinned from 'lucide-react/icons/map-pinned';
import NotebookTabs from 'lucide-react/icons/notebook-tabs';
import ReceiptText from 'lucide-react/icons/receipt-text';
import Truck from 'lucide-react/icons/truck';
import Users from 'lucide-react/icons/users';
import Wallet from 'lucide-react/icons/wallet';
import Warehouse from 'lucide-react/icons/warehouse';

/**
 * One picture for each kind of page in the navigation. Each icon is imported from its own file so
 * only these reach the build. The label beside it says the same in words: the icon is hidden from
 * screen readers.
 */
const ICONS = {
  home: House,
  /** Building sites: the places the roofs are. */
  sites: MapPinned,
  orders: ClipboardList,
  /** Asking a merchant for a price, and the merchant's list of those requests. */
  quotes: FileQuestionMark,
  orderBook: NotebookTabs,
  yard: Forklift,
  fleet: Truck,
  /** Products and their stock. */
  catalogue: Boxes,
  invoices: ReceiptText,
  /** Customers' credit accounts and their terms. */
  accounts: Wallet,
  organisation: Building2,
  /** A merchant's yards and counters. */
  branches: Warehouse,
  team: Users,
} as const;

export type NavIconName = keyof typeof ICONS;

export function NavIcon({ name, className = 'h-5 w-5' }: { name: NavIconName; className?: string }) {
  const Icon = ICONS[name];
  return <Icon className={`shrink-0 ${className}`} strokeWidth={1.8} aria-hidden="true" focusable="false" data-icon={name} />;
}
