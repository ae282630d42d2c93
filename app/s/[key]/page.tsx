import { RoomRoute } from '@/components/room/RoomRoute';

export const metadata = { title: 'Shared section · Dewline', referrer: 'no-referrer' as const };

export default async function Page({ params }: { params: Promise<{ key: string }> }) {
  const { key } = await params;
  return <RoomRoute roomKey={key} />;
}
