import type { describeRoutes } from "./describeRoutes.js";
import type { DoubtfulPlace } from "./doubtfulPlaces.js";

/** The route map in words for screen readers, in `target`: each route's stops in order, the unassigned stops and the doubtful places. */
export function renderMapText(
  target: HTMLElement,
  words: ReturnType<typeof describeRoutes>,
  depots: readonly string[],
  doubtful: readonly DoubtfulPlace[],
): void {
  const heading = document.createElement("p");
  heading.textContent = `Route map in words: ${words.routes.length} route${words.routes.length === 1 ? "" : "s"}; depots: ${[...new Set(depots)].join(", ")}.`;
  const list = document.createElement("ul");
  for (const r of words.routes) {
    const li = document.createElement("li");
    const ol = document.createElement("ol");
    ol.append(
      ...r.stops.map((s) => {
        const item = document.createElement("li");
        item.textContent = s;
        return item;
      }),
    );
    li.append(r.summary, ol);
    list.append(li);
  }
  const nodes: HTMLElement[] = [heading, list];
  if (words.unassigned.length > 0) {
    const un = document.createElement("ul");
    un.append(
      ...words.unassigned.map((s) => {
        const item = document.createElement("li");
        item.textContent = s;
        return item;
      }),
    );
    nodes.push(un);
  }
  if (doubtful.length > 0) {
    const note = document.createElement("p");
    note.textContent = `Doubtful address matches, marked with a dashed ring and a question mark: ${doubtful.length}.`;
    const list = document.createElement("ul");
    list.className = "doubtful";
    list.append(
      ...doubtful.map((d) => {
        const item = document.createElement("li");
        item.textContent = `${d.name} (${d.cell}): ${d.match}`;
        return item;
      }),
    );
    nodes.push(note, list);
  }
  target.replaceChildren(...nodes);
}
