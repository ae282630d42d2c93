export default function Home() {
  return <main><h1>Dewline</h1></main>;
}
