// A DOM for the rendering functions, from jsdom; installed as globals before each test file.
import { JSDOM } from 'jsdom';

export function installDom(): JSDOM {
  const dom = new JSDOM('<!doctype html><html><body></body></html>', { url: 'http://localhost/' });
  const g = globalThis as unknown as Record<string, unknown>;
  g.window = dom.window;
  g.document = dom.window.document;
  g.HTMLElement = dom.window.HTMLElement;
  g.Node = dom.window.Node;
  return dom;
}
