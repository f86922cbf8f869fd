/**
 * `npm run bench`: times the engine's hot paths against straightforward baselines,
 * measured in the same run. Each area adds its cases in its own test/bench/cases-*.ts.
 */
import { runCases } from "./harness";
import { engineCases } from "./cases-engine";
import { resamplingCases } from "./cases-resampling";
import { rankCases } from "./cases-ranks";
import { statsCases } from "./cases-stats";
import { panelCases } from "./cases-panel";

console.log(`Reshuffle benchmarks (node ${process.version}); medians of repeated runs`);
runCases([...engineCases, ...resamplingCases, ...rankCases, ...statsCases, ...panelCases]);
