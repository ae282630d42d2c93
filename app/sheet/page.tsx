import SheetPage from '@/components/sheet/SheetPage';

export const metadata = { title: 'Sheet · Dewline' };

export default function Page() {
  return <SheetPage />;
}
