export default function Hello() {
  return <p>Hello</p>;
}
