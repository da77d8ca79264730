import { env } from "~/config/env.server";

/** An address inside the app as a link in mail (pass the path from React Router's `href()`). */
export function absoluteUrl(path: string) {
  return `${env.APP_URL}${path}`;
}
