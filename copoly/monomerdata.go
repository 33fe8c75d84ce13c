package copoly

import "math"

// Physical states of a monomer at room temperature, for [Properties.State].
const (
	StateLiquid = "liquid"
	StateGas    = "gas"
	StateSolid  = "solid"
)

// Hazard classes of [Properties.Hazards], in the words of the GHS hazard statements they stand
// for.
const (
	HazardFlammable    = "flammable"
	HazardExtremelyFl  = "extremely flammable"
	HazardGas          = "gas under pressure"
	HazardToxic        = "toxic"
	HazardCarcinogen   = "carcinogen (known or suspected)"
	HazardMutagen      = "mutagen (suspected)"
	HazardReproductive = "reproductive toxicant (suspected)"
	HazardSensitiser   = "skin sensitiser"
	HazardCorrosive    = "corrosive"
	HazardIrritant     = "irritant"
)

// Properties are the process data of a built-in monomer, each with its source: a per-value
// source text (…Source) and the ID of its entry in [Sources] (…SourceID).
type Properties struct {
	// State at 20–25 °C and 1 atm: StateLiquid, StateGas or StateSolid. Volumes are offered for
	// liquids only.
	State string
	// Density in g/mL of the liquid at DensityTemp °C (for a gas: of the liquid under its own
	// vapour pressure; for a solid: of the solid).
	Density, DensityTemp float64
	DensitySource        string
	DensitySourceID      string
	// HeatOfPolymerization is −ΔHp in kJ/mol (positive: heat released per mole polymerized).
	HeatOfPolymerization float64
	HeatSource           string
	HeatSourceID         string
	// Hazards lists the hazard classes (see the Hazard constants).
	Hazards        []string
	HazardSource   string
	HazardSourceID string
	// Tg is the glass transition temperature of the homopolymer in K, for Fox estimates; 0 when
	// none is given (TgNote says why). TgNote also says where sources disagree and which value
	// was chosen.
	Tg         float64
	TgSource   string
	TgSourceID string
	TgNote     string
	// Hydroxyl and Acid are the functional groups per monomer unit that count in the hydroxyl
	// value and in the acid value (ISO 2114 method A, the partial acid value, in which an
	// anhydride counts once); AcidTotal counts them as in the total acid value (ISO 2114 method B,
	// the anhydride hydrolysed: twice).
	Hydroxyl, Acid, AcidTotal float64
	GroupsSource              string
	GroupsSourceID            string
}

// monomerData is one row of the built-in process data, in the units and words of its sources.
type monomerData struct {
	state                     string
	density, densityTemp      float64
	densityID, densityDetail  string
	heat                      float64
	heatID, heatDetail        string
	hazards                   []string
	hazardID, hazardDetail    string
	tgC                       float64 // °C as the sources give it; NaN when none is given
	tgID, tgDetail, tgNote    string
	hydroxyl, acid, acidTotal float64
	groupsID, groupsDetail    string
}

const (
	noGroups    = "no hydroxyl or acid group"
	kelvinShift = 273.15 // K = °C + 273.15
)

// builtinData holds the process data of the built-in monomers.
var builtinData = map[string]monomerData{
	"styrene": {
		StateLiquid, 0.9059, 20, SrcMerckWeb, "monograph \"Styrene\" (d²⁰ 0.9059)",
		70, SrcHeatStyrene, "69.79 ± 0.66 kJ/mol, liquid monomer to solid polymer, 25 °C",
		[]string{HazardFlammable, HazardReproductive, HazardIrritant}, SrcHazardsRecalled, "",
		100, SrcTgKoiry, "Tg ≈ 100 °C", "",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"methyl methacrylate": {
		StateLiquid, 0.936, 20, SrcSovietEncycl, "0.936 g/cm³ at 20 °C",
		56, SrcHeatRecalled, "",
		[]string{HazardFlammable, HazardSensitiser, HazardIrritant}, SrcHazardsRecalled, "",
		105, SrcTgMorita, "105 °C",
		"Tg of PMMA depends on tacticity: the value chosen, 105 °C, is the typical one for conventional free-radical " +
			"PMMA (atactic, rich in syndiotactic dyads), which is what a radical acrylic resin contains. Isotactic PMMA " +
			"lies near 40–55 °C and highly syndiotactic PMMA near 125–130 °C (these two ranges not checked against a " +
			"printed source).",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"methyl acrylate": {
		StateLiquid, 0.9561, 20, SrcMerckWeb, "monograph \"Methyl Acrylate\" (d²⁰₄ 0.9561)",
		78, SrcHeatRecalled, "",
		[]string{HazardFlammable, HazardSensitiser, HazardIrritant, HazardToxic}, SrcHazardsRecalled, "",
		10, SrcTgRecalled, "10 °C", "",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"ethyl acrylate": {
		StateLiquid, 0.92, 20, SrcDensityRecalled, "",
		78, SrcHeatRecalled, "",
		[]string{HazardFlammable, HazardSensitiser, HazardIrritant, HazardToxic}, SrcHazardsRecalled, "",
		-24, SrcTgMorita, "−24 °C", "",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"n-butyl acrylate": {
		StateLiquid, 0.8986, 20, SrcMerckWeb, "monograph \"n-Butyl Acrylate\" (d²⁰₄ 0.8986)",
		78, SrcHeatRecalled, "",
		[]string{HazardFlammable, HazardSensitiser, HazardIrritant}, SrcHazardsRecalled,
		"in part confirmed: International Chemical Safety Card ICSC 0400 lists it as flammable",
		-54, SrcTgRecalled, "−54 °C", "Handbooks give −49 to −56 °C for poly(n-butyl acrylate).",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"2-ethylhexyl acrylate": {
		StateLiquid, 0.885, 25, SrcDensityRecalled, "",
		62, SrcHeatRecalled, "value for 2-ethylhexyl acrylate especially uncertain",
		[]string{HazardSensitiser, HazardIrritant}, SrcHazardsRecalled, "",
		-60, SrcTgKoiry, "−60 °C",
		"Compilations give −50 to −70 °C for poly(2-ethylhexyl acrylate) (that range not checked against a printed " +
			"source); −60 °C is the value of the source read. " +
			"For pressure-sensitive adhesives the choice moves a Fox estimate by several kelvin: measure.",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"acrylonitrile": {
		StateLiquid, 0.8060, 20, SrcDensityRecalled, "",
		76, SrcHeatRecalled, "",
		[]string{HazardFlammable, HazardToxic, HazardCarcinogen, HazardSensitiser, HazardIrritant}, SrcHazardsRecalled, "",
		97, SrcTgRecalled, "97 °C",
		"Radical poly(acrylonitrile) is usually quoted between 85 and 105 °C; a supplier's table lists 125 °C for " +
			"the syndiotactic polymer.",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"vinyl acetate": {
		StateLiquid, 0.934, 20, SrcDensityRecalled, "",
		88, SrcHeatRecalled, "",
		[]string{HazardExtremelyFl, HazardCarcinogen, HazardIrritant}, SrcHazardsRecalled, "",
		30, SrcTgRecalled, "30 °C", "Handbooks give 28–32 °C for poly(vinyl acetate); water plasticizes it.",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"vinyl chloride": {
		StateGas, 0.911, 25, SrcDensityRecalled, "liquid under its own vapour pressure",
		72, SrcHeatRecalled, "",
		[]string{HazardExtremelyFl, HazardGas, HazardCarcinogen}, SrcHazardsRecalled, "",
		81, SrcTgRecalled, "81 °C", "Handbooks give 80–87 °C for poly(vinyl chloride).",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"1,3-butadiene": {
		StateGas, 0.6149, 25, SrcDensityRecalled, "liquid under pressure",
		73, SrcHeatRecalled, "",
		[]string{HazardExtremelyFl, HazardGas, HazardCarcinogen, HazardMutagen}, SrcHazardsRecalled, "",
		-85, SrcTgRecalled, "−85 °C",
		"Tg of polybutadiene depends on its microstructure (cis-1,4 near −100 °C, more 1,2 units raise it); −85 °C " +
			"is for the mixed microstructure of radical (emulsion) polybutadiene.",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"acrylic acid": {
		StateLiquid, 1.049, 20, SrcDensityRecalled, "",
		67, SrcHeatRecalled, "",
		[]string{HazardFlammable, HazardCorrosive, HazardToxic}, SrcHazardsRecalled, "",
		105, SrcTgSupplierTable, "105 °C", "Other handbooks give 106 °C and water lowers it strongly (recalled, not checked).",
		0, 1, 1, SrcGroupsFormula, "one COOH per unit",
	},
	"methacrylic acid": {
		StateLiquid, 1.0153, 20, SrcMerckWeb, "monograph \"Methacrylic Acid\" (d²⁰₄ 1.0153; melts at 16 °C)",
		66, SrcHeatRecalled, "",
		[]string{HazardCorrosive, HazardToxic}, SrcHazardsRecalled, "",
		228, SrcTgRecalled, "228 °C",
		"Poly(methacrylic acid) forms anhydride on heating, so DSC values scatter (about 185–230 °C).",
		0, 1, 1, SrcGroupsFormula, "one COOH per unit",
	},
	"maleic anhydride": {
		StateSolid, 1.48, 20, SrcDensityRecalled, "solid; melts at 52.8 °C",
		59, SrcHeatRecalled, "",
		[]string{HazardCorrosive, HazardSensitiser, HazardToxic}, SrcHazardsRecalled, "",
		math.NaN(), "", "",
		"No homopolymer Tg is given: maleic anhydride hardly homopolymerizes under ordinary radical conditions. For a " +
			"Fox estimate of a maleic anhydride copolymer use a measured value.",
		0, 1, 2, SrcAnhydrideAcid, "one anhydride per unit: 1 in the partial acid value, 2 in the total acid value",
	},
	"N-vinylpyrrolidone": {
		StateLiquid, 1.04, 25, SrcDensityRecalled, "",
		54, SrcHeatRecalled, "value for N-vinylpyrrolidone especially uncertain",
		[]string{HazardCarcinogen, HazardToxic, HazardIrritant}, SrcHazardsRecalled, "",
		175, SrcTgRecalled, "175 °C",
		"Tg of poly(N-vinylpyrrolidone) depends strongly on molar mass and on absorbed water (quoted values run from " +
			"about 110 to 180 °C).",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"2-hydroxyethyl methacrylate": {
		StateLiquid, 1.07, 25, SrcDensityRecalled, "",
		50, SrcHeatRecalled, "value for 2-hydroxyethyl methacrylate especially uncertain",
		[]string{HazardSensitiser, HazardIrritant}, SrcICSC,
		"ICSC 1724 (2008): skin and eye irritation, allergic skin reaction; also may be harmful if swallowed and " +
			"enters airways; combustible",
		80, SrcTgMorita, "80 °C",
		"Handbooks disagree widely for poly(2-hydroxyethyl methacrylate) (about 55–100 °C; that range not checked " +
			"against a printed source): absorbed water plasticizes it. 80 °C is the value of the source read.",
		1, 0, 0, SrcGroupsFormula, "one OH per unit",
	},
	"acrylamide": {
		StateSolid, 1.122, 30, SrcDensityRecalled, "solid; melts at 84.5 °C",
		82, SrcHeatRecalled, "",
		[]string{HazardToxic, HazardCarcinogen, HazardMutagen, HazardReproductive, HazardSensitiser}, SrcHazardsRecalled, "",
		165, SrcTgSupplierTable, "165 °C", "",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"n-butyl methacrylate": {
		StateLiquid, 0.894, 25, SrcDensityRecalled,
		"a NOAA CAMEO Chemicals datasheet text, as quoted by a chemical database page, gives 7.5 lb/gal (≈0.90 g/mL)",
		58, SrcHeatRecalled, "",
		[]string{HazardFlammable, HazardSensitiser, HazardIrritant}, SrcICSC,
		"ICSC 1018 (2009): flammable; EU classification Xi, R10-36/37/38-43 (irritating to eyes, respiratory system " +
			"and skin; may cause sensitization by skin contact)",
		20, SrcTgMorita, "20 °C", "",
		0, 0, 0, SrcGroupsFormula, noGroups,
	},
	"2-hydroxyethyl acrylate": {
		StateLiquid, 1.011, 25, SrcDensityRecalled, "",
		78, SrcHeatRecalled, "taken equal to the other acrylates",
		[]string{HazardToxic, HazardCorrosive, HazardSensitiser}, SrcHazardsRecalled,
		"in part confirmed: the ECHA registration dossier (EC 212-454-9) states that it is corrosive to skin and " +
			"eyes, and the Japanese government's GHS classification (FY2008) does not class it as a flammable liquid " +
			"(flash point 101 °C)",
		-15, SrcTgRecalled, "−15 °C", "",
		1, 0, 0, SrcGroupsFormula, "one OH per unit",
	},
	"2-hydroxypropyl methacrylate": {
		StateLiquid, 1.066, 25, SrcDensityRecalled,
		"the technical monomer is a mixture of the 2-hydroxypropyl and 2-hydroxy-1-methylethyl esters",
		50, SrcHeatRecalled, "taken equal to 2-hydroxyethyl methacrylate; McCurdy and Laidler found both abnormally low",
		[]string{HazardSensitiser, HazardIrritant}, SrcHazardsRecalled, "",
		76, SrcTgRecalled, "76 °C", "Handbooks give about 73–76 °C; like poly(HEMA) it is plasticized by water.",
		1, 0, 0, SrcGroupsFormula, "one OH per unit (either isomer)",
	},
}

// PropertiesOf returns the process data of a built-in monomer, and whether it has any.
func PropertiesOf(name string) (Properties, bool) {
	d, ok := builtinData[name]
	if !ok {
		return Properties{}, false
	}
	p := Properties{
		State: d.state, Density: d.density, DensityTemp: d.densityTemp,
		DensitySource: cite(d.densityID, d.densityDetail), DensitySourceID: d.densityID,
		HeatOfPolymerization: d.heat, HeatSource: cite(d.heatID, d.heatDetail), HeatSourceID: d.heatID,
		Hazards: append([]string(nil), d.hazards...), HazardSource: cite(d.hazardID, d.hazardDetail), HazardSourceID: d.hazardID,
		TgSource: cite(d.tgID, d.tgDetail), TgSourceID: d.tgID, TgNote: d.tgNote,
		Hydroxyl: d.hydroxyl, Acid: d.acid, AcidTotal: d.acidTotal,
		GroupsSource: cite(d.groupsID, d.groupsDetail), GroupsSourceID: d.groupsID,
	}
	if !math.IsNaN(d.tgC) {
		p.Tg = d.tgC + kelvinShift
	}
	return p, true
}
