package copoly

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

// Properties are the process data of a built-in monomer, each with its source.
type Properties struct {
	// State at 20–25 °C and 1 atm: StateLiquid, StateGas or StateSolid. Volumes are offered for
	// liquids only.
	State string
	// Density in g/mL of the liquid at DensityTemp °C (for a gas: of the liquid under its own
	// vapour pressure; for a solid: of the solid). DensitySource names its origin.
	Density, DensityTemp float64
	DensitySource        string
	// HeatOfPolymerization is −ΔHp in kJ/mol (positive: heat released per mole polymerized).
	HeatOfPolymerization float64
	HeatSource           string
	// Hazards lists the hazard classes (see the Hazard constants); HazardSource names their origin.
	Hazards      []string
	HazardSource string
}

const (
	srcMerck      = "Merck-Index-style monomer entry (d at the stated temperature, g/mL)"
	srcSupplier   = "supplier or producer technical data sheet"
	srcHeatMemory = "from memory of handbook tables of heats of polymerization (Polymer Handbook; Odian, Principles of Polymerization, 4th ed., Table 3-14); unverified — check before relying on it"
	srcHazards    = "GHS classification as commonly given on suppliers' safety data sheets (from memory); always read the SDS of the material you use"
)

// builtinProperties holds the process data of the built-in monomers.
var builtinProperties = map[string]Properties{
	"styrene":             {StateLiquid, 0.9059, 20, srcMerck, 70, srcHeatMemory, []string{HazardFlammable, HazardReproductive, HazardIrritant}, srcHazards},
	"methyl methacrylate": {StateLiquid, 0.936, 20, "encyclopaedia entry (other handbooks give 0.943 at 20 °C)", 56, srcHeatMemory, []string{HazardFlammable, HazardSensitiser, HazardIrritant}, srcHazards},
	"methyl acrylate":     {StateLiquid, 0.9561, 20, srcMerck, 78, srcHeatMemory, []string{HazardFlammable, HazardSensitiser, HazardIrritant, HazardToxic}, srcHazards},
	"ethyl acrylate":      {StateLiquid, 0.92, 20, srcSupplier, 78, srcHeatMemory, []string{HazardFlammable, HazardSensitiser, HazardIrritant, HazardToxic}, srcHazards},
	"n-butyl acrylate":    {StateLiquid, 0.8986, 20, srcMerck, 78, srcHeatMemory, []string{HazardFlammable, HazardSensitiser, HazardIrritant}, srcHazards},
	"2-ethylhexyl acrylate": {StateLiquid, 0.885, 25, "encyclopaedia entry", 62,
		srcHeatMemory + " (value for 2-ethylhexyl acrylate especially uncertain)", []string{HazardSensitiser, HazardIrritant}, srcHazards},
	"acrylonitrile":               {StateLiquid, 0.8060, 20, srcMerck, 76, srcHeatMemory, []string{HazardFlammable, HazardToxic, HazardCarcinogen, HazardSensitiser, HazardIrritant}, srcHazards},
	"vinyl acetate":               {StateLiquid, 0.934, 20, "encyclopaedia entry", 88, srcHeatMemory, []string{HazardExtremelyFl, HazardCarcinogen, HazardIrritant}, srcHazards},
	"vinyl chloride":              {StateGas, 0.911, 25, "supplier data (liquid under its own vapour pressure)", 72, srcHeatMemory, []string{HazardExtremelyFl, HazardGas, HazardCarcinogen}, srcHazards},
	"1,3-butadiene":               {StateGas, 0.6149, 25, "encyclopaedia entry (liquid under pressure)", 73, srcHeatMemory, []string{HazardExtremelyFl, HazardGas, HazardCarcinogen, HazardMutagen}, srcHazards},
	"acrylic acid":                {StateLiquid, 1.049, 20, srcSupplier, 67, srcHeatMemory, []string{HazardFlammable, HazardCorrosive, HazardToxic}, srcHazards},
	"methacrylic acid":            {StateLiquid, 1.0153, 20, srcMerck + "; melts at 16 °C", 66, srcHeatMemory, []string{HazardCorrosive, HazardToxic}, srcHazards},
	"maleic anhydride":            {StateSolid, 1.48, 20, srcMerck + "; melts at 52.8 °C", 59, srcHeatMemory, []string{HazardCorrosive, HazardSensitiser, HazardToxic}, srcHazards},
	"N-vinylpyrrolidone":          {StateLiquid, 1.04, 25, "supplier data via encyclopaedia entry", 54, srcHeatMemory + " (value for N-vinylpyrrolidone especially uncertain)", []string{HazardCarcinogen, HazardToxic, HazardIrritant}, srcHazards},
	"2-hydroxyethyl methacrylate": {StateLiquid, 1.07, 25, "encyclopaedia entry", 50, srcHeatMemory + " (value for 2-hydroxyethyl methacrylate especially uncertain)", []string{HazardSensitiser, HazardIrritant}, srcHazards},
	"acrylamide":                  {StateSolid, 1.122, 30, srcMerck + "; melts at 84.5 °C", 82, srcHeatMemory, []string{HazardToxic, HazardCarcinogen, HazardMutagen, HazardReproductive, HazardSensitiser}, srcHazards},
}

// PropertiesOf returns the process data of a built-in monomer, and whether it has any.
func PropertiesOf(name string) (Properties, bool) {
	p, ok := builtinProperties[name]
	return p, ok
}
