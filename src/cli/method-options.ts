import { Option } from 'commander';
import { ROUTE_KILOMETRE_POST_RULES } from '../georef/types.ts';

/**
 * `--route-kilometre-post <rule>`, the method choice routeKilometrePost (src/georef/method-defaults.ts), as `locate`, `batch` and `cluster-script` take it.
 * @example program.addOption(routeKilometrePostOption()) // --route-kilometre-post decline → opts.routeKilometrePost 'decline'
 */
export function routeKilometrePostOption(): Option {
  const description =
    "a route between two places with a road kilometre post beside it and no road line: 'route' answers the whole route, the post not placed; 'decline' gives no georeference (`whereabouts method` gives the rule in force)";
  return new Option('--route-kilometre-post <rule>', description).choices(ROUTE_KILOMETRE_POST_RULES);
}
