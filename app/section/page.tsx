import SectionPage from '@/components/section-page/SectionPage';

export const metadata = { title: 'Section · Dewline' };

export default function Page() {
  return <SectionPage />;
}
