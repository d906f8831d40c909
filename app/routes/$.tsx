import { data } from "react-router";

export const meta = () => [{ title: "Not found · Nearnote" }];

// Every unknown address lands here so the root error page can say "not found".
export function loader() {
  throw data(null, { status: 404 });
}

export default function NotFound() {
  return null;
}
