// Package plan turns a target copolymer composition into a recipe and schedule for the reactor,
// for the terminal model ([copoly.Terminal]).
//
// [Make] plans a batch (charged at the feed that gives the target, stopped at the conversion the
// composition tolerance allows), a semi-batch at constant composition (the faster monomer, or a
// mixture, metered in proportion to the polymer formed) or shot additions, with the time axis
// of a rate law or a measured conversion–time table, pump rates, and the safety figures of the
// largest unreacted inventory (the heat it would release and its adiabatic temperature rise).
// [BandOf] replays a plan over the reactivity ratios allowed by their joint confidence region
// and returns the spread of the outcome; [StarvedFeed] gives the monomer inventory of a starved
// feed.
//
// A plan is a calculation, not a procedure: toxic and flammable monomers, runaway exotherms and
// monomer piling up in a feed need the usual cautions, local codes and licensed practice.
package plan
