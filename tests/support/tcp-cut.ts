import net from "node:net";

/**
 * A TCP relay on loopback that a test can cut and restore: cutting resets every open connection
 * and refuses new ones, as PostgreSQL does while it restarts or when the network drops.
 */
export interface TcpCut {
  port: number;
  cut: () => Promise<void>;
  restore: () => Promise<void>;
  close: () => Promise<void>;
}

export async function startTcpCut(targetPort: number, targetHost = "127.0.0.1"): Promise<TcpCut> {
  const sockets = new Set<net.Socket>();
  const handle = (client: net.Socket) => {
    const upstream = net.connect(targetPort, targetHost);
    for (const s of [client, upstream]) {
      sockets.add(s);
      s.on("close", () => sockets.delete(s));
      s.on("error", () => undefined);
    }
    client.pipe(upstream).pipe(client);
    client.on("close", () => upstream.destroy());
    upstream.on("close", () => client.destroy());
  };
  let server = net.createServer(handle);
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const port = (server.address() as net.AddressInfo).port;
  const stop = () =>
    new Promise<void>((resolve) => {
      for (const s of sockets) s.resetAndDestroy();
      server.close(() => resolve());
    });
  return {
    port,
    cut: stop,
    restore: async () => {
      server = net.createServer(handle);
      await new Promise<void>((r) => server.listen(port, "127.0.0.1", r));
    },
    close: stop,
  };
}
