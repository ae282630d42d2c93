import { Caution } from '@/components/Caution';
import { StartPanel } from '@/components/home/StartPanel';

export default function Home() {
  return (
    <main className="home">
      <header className="home-head">
        <h1>Dewline</h1>
        <p>Draw a foundation section, see where it runs cold, and share it with the builder.</p>
      </header>
      <StartPanel />
      <Caution />
    </main>
  );
}
