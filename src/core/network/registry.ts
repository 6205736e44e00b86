/**
 * The connector kinds: one line each. A new kind is one file in connectors/
 * and one line here (plus its spec in types.ts).
 */
import { ClosedConnector } from './connectors/closed.js';
import { OpenConnector } from './connectors/open.js';
import { RestrictedConnector } from './connectors/restricted.js';
import { OrificeConnector } from './connectors/orifice.js';
import { JunctionConnector } from './connectors/junction.js';
import type { Connector, ConnectorSpec } from './types.js';
import type { Network } from './network.js';

type Builders = { [K in ConnectorSpec['kind']]: (spec: Extract<ConnectorSpec, { kind: K }>, net: Network) => Connector };

const BUILDERS: Builders = {
  closed: (c, net) => new ClosedConnector(c.name, net.end(c.end.pipe, c.end.side)),
  open: (c, net) => new OpenConnector(c.name, net.end(c.end.pipe, c.end.side), net.volume(c.volume), c.entryLoss),
  restricted: (c, net) => new RestrictedConnector(c.name, net.end(c.end.pipe, c.end.side), net.volume(c.volume), c.area),
  orifice: (c, net) => new OrificeConnector(c.name, net.volume(c.from), net.volume(c.to), c.area),
  junction: (c, net) =>
    new JunctionConnector(
      c.name,
      c.ends.map((e) => net.end(e.pipe, e.side)),
      net.pipe(c.ends[0]!.pipe).spec.initial.temperature,
    ),
};

export function createConnector(spec: ConnectorSpec, net: Network): Connector {
  const build = BUILDERS[spec.kind] as (s: ConnectorSpec, n: Network) => Connector;
  return build(spec, net);
}
