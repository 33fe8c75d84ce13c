package copoly

import "strings"

// UncheckedMark is the words that mark a source whose values could not be checked against a
// printed or published source. Each unchecked [Source] carries it once, in its Note; the values
// that cite such a source carry only the short [UncheckedTag].
const UncheckedMark = "value not checked against a printed source — confirm before use"

// UncheckedTag ends the per-value source text of a value whose source is unchecked, so that a
// page showing only that text still shows the value as unchecked.
const UncheckedTag = "not checked — see the note on this source"

// Source is one entry of the table of sources the built-in data cite. Every built-in value
// (molar masses through the atomic weights, densities, heats of polymerization, hazard classes,
// glass transitions, functional groups, Q–e values and reactivity-ratio pairs) names one source
// by its ID.
type Source struct {
	// ID is a short stable key, e.g. "iupac-2021".
	ID string
	// Short is the label used in the per-value source texts.
	Short string
	// Citation is the full citation: authors, title, journal or publisher, year, table or page,
	// and where it was read.
	Citation string
	// Checked is true when the values citing this source were read in it (or, where Note says
	// so, in a public transcription of it, or counted from the formula).
	Checked bool
	// Note says what was read and its caveats, once for all the values that cite the source;
	// for an unchecked source it contains UncheckedMark exactly once.
	Note string
}

// Source IDs of the built-in data.
const (
	SrcAtomicWeights   = "iupac-2021"
	SrcMerckWeb        = "merck-monographs"
	SrcSovietEncycl    = "gse-mma"
	SrcDensityRecalled = "density-recalled"
	SrcHeatStyrene     = "heat-styrene-1947"
	SrcHeatRecalled    = "heat-recalled"
	SrcICSC            = "icsc"
	SrcHazardsRecalled = "hazards-recalled"
	SrcTgMorita        = "morita-2014"
	SrcTgKoiry         = "koiry-2014"
	SrcTgSupplierTable = "tg-supplier-table"
	SrcTgRecalled      = "tg-recalled"
	SrcGroupsFormula   = "groups-formula"
	SrcAnhydrideAcid   = "astm-d3643"
	SrcQEReference     = "qe-reference"
	SrcQERecalled      = "qe-recalled"
	SrcHandbookRatios  = "handbook-ratios"
	SrcStEHA2004       = "st-eha-2004"
	SrcJordan1960      = "jordan-1960"
	SrcMukherjee1998   = "mukherjee-1998"
	SrcIdowu2019       = "idowu-2019"
	SrcStBANMP2004     = "st-ba-nmp-2004"
	SrcAAEA            = "aa-ea-kobunshi"
)

// sourceTable is the table of sources, in the order the page lists them.
var sourceTable = []Source{
	{
		ID:    SrcAtomicWeights,
		Short: "IUPAC standard atomic weights 2021 (abridged values)",
		Citation: "T. Prohaska et al., \"Standard atomic weights of the elements 2021 (IUPAC Technical Report)\", " +
			"Pure Appl. Chem. 2022, 94(5), 573–600, doi:10.1515/pac-2019-0603 (open access).",
		Checked: true,
		Note: "The abridged standard atomic weights (five significant figures) were read from a public machine-readable " +
			"transcription of the report's table of standard and abridged values; the report's abstract was read on the " +
			"publisher's page. H 1.0080, C 12.011, N 14.007, O 15.999, F 18.998, Si 28.085, P 30.974, S 32.06, Cl 35.45, " +
			"K 39.098, Br 79.904. Molar masses follow from the formulas with these values.",
	},
	{
		ID:    SrcMerckWeb,
		Short: "The Merck Index",
		Citation: "The Merck Index (Merck & Co.), monographs named with each value; read in public web transcriptions " +
			"of the monographs, which do not state the edition.",
		Checked: true,
		Note: "Densities are d at t °C relative to water at 4 °C, numerically g/mL. Where the US public bodies list a " +
			"specific gravity (OSHA Occupational Chemical Database; NIOSH Pocket Guide to Chemical Hazards, DHHS (NIOSH) " +
			"Publ. No. 2005-151) it agrees to the two decimals they give: styrene 0.91, n-butyl acrylate 0.89. Liquid " +
			"densities fall by about 0.1 % per kelvin.",
	},
	{
		ID:    SrcSovietEncycl,
		Short: "Great Soviet Encyclopedia, article \"Methyl Methacrylate\"",
		Citation: "The Great Soviet Encyclopedia, 3rd ed. (1970–1979), article \"Methyl Methacrylate\", in the English " +
			"translation reproduced at encyclopedia2.thefreedictionary.com.",
		Checked: true,
		Note: "Gives 0.936 g/cm³ at 20 °C. A safety-data compilation read at the same time gives 0.9491 g/cm³ at 15 °C, " +
			"which with the usual −0.1 %/K suggests about 0.943 at 20 °C: the two differ by 0.7 %. Weigh methyl " +
			"methacrylate rather than measure it by volume when that matters.",
	},
	{
		ID:    SrcDensityRecalled,
		Short: "density as recorded earlier in this library",
		Citation: "Densities recorded earlier in this library from handbook entries, encyclopaedia entries and data sheets " +
			"that could not be traced to a source read here.",
		Checked: false,
		Note: UncheckedMark + ". For the gases (vinyl chloride, 1,3-butadiene) the density is that of the liquid " +
			"under its own vapour pressure; for the solids, that of the solid. Ethyl acrylate: published values " +
			"disagree (a public transcription of its Merck Index monograph gives d²⁰₄ 0.9405, other data sheets about " +
			"0.92); weigh it.",
	},
	{
		ID:    SrcHeatStyrene,
		Short: "bomb calorimetry of styrene and polystyrene (1947)",
		Citation: "\"Heats of combustion and solution of liquid styrene and solid polystyrene and heat of polymerization " +
			"of styrene\" (1947), abstract (journal details were not shown on the page read).",
		Checked: true,
		Note: "The abstract gives 69.79 ± 0.66 kJ/mol (16.68 kcal/mol) for liquid styrene to solid polystyrene at 25 °C, " +
			"and 73.38 kJ/mol when the product is a 6.9 % solution of polystyrene in styrene. It agrees with 70.2 kJ/mol " +
			"measured by reaction calorimetry in seeded styrene emulsion polymerization (D. J. Lamb, C. M. Fellows, " +
			"B. R. Morrison, R. G. Gilbert, \"A critical evaluation of reaction calorimetry for the study of emulsion " +
			"polymerization systems: thermodynamic and kinetic aspects\", 2005, abstract).",
	},
	{
		ID:    SrcHeatRecalled,
		Short: "heat of polymerization recalled from handbook tables",
		Citation: "Heats of polymerization recalled from handbook tables (Polymer Handbook, 4th ed., Wiley 1999; G. Odian, " +
			"Principles of Polymerization, 4th ed., Wiley 2004, Table 3-14), not re-read here.",
		Checked: false,
		Note: UncheckedMark + ". As a range check only: K. G. McCurdy and K. J. Laidler, \"Thermochemical studies of " +
			"some acrylate and methacrylate polymerizations in emulsion systems\", Can. J. Chem. 1964, 42, 818–824 " +
			"(abstract read), found 13–19 kcal/mol (54–79 kJ/mol) for acrylic acid, methyl, ethyl and butyl acrylate, " +
			"methacrylic acid and methyl to hexyl methacrylate in emulsion, and abnormally low heats for " +
			"2-hydroxyethyl and 2-hydroxypropyl methacrylate. −ΔHp depends on the states of monomer and polymer " +
			"and on the temperature; for a reactor's heat balance use a measured value.",
	},
	{
		ID:    SrcICSC,
		Short: "International Chemical Safety Card",
		Citation: "International Chemical Safety Cards, International Labour Organization and World Health Organization " +
			"(IPCS), cards as numbered with each monomer, read at inchem.org and ilo.org.",
		Checked: true,
		Note: "The classes listed are those the card gives (its EU classification and, where given, its UN GHS " +
			"classification). A card is a summary: always read the safety data sheet of the material you use.",
	},
	{
		ID:    SrcHazardsRecalled,
		Short: "hazard classes as commonly given on safety data sheets",
		Citation: "GHS hazard classes as commonly given on suppliers' safety data sheets, recalled, not traced here to " +
			"the harmonised EU classification (CLP Annex VI) or another public list.",
		Checked: false,
		Note: UncheckedMark + ". The list errs on the side of caution but may be incomplete: always read the safety " +
			"data sheet of the material you use, and follow local codes and licensed practice.",
	},
	{
		ID:    SrcTgMorita,
		Short: "Morita, Front. Chem. 2014, Table 2",
		Citation: "S. Morita, \"Hydrogen-bonds structure in poly(2-hydroxyethyl methacrylate) studied by " +
			"temperature-dependent infrared spectroscopy\", Front. Chem. 2014, 2, 10, doi:10.3389/fchem.2014.00010, " +
			"Table 2 (typical glass transition temperatures, after Morita et al. 2004).",
		Checked: true,
		Note: "Typical values: poly(ethyl acrylate) −24 °C, poly(n-butyl methacrylate) 20 °C, poly(2-hydroxyethyl " +
			"methacrylate) 80 °C, poly(methyl methacrylate) 105 °C. Kelvin = °C + 273.15.",
	},
	{
		ID:    SrcTgKoiry,
		Short: "Koiry and Singha, Front. Chem. 2014, Introduction",
		Citation: "B. P. Koiry, N. K. Singha, \"Copper mediated controlled radical copolymerization of styrene and " +
			"2-ethylhexyl acrylate and determination of their reactivity ratios\", Front. Chem. 2014, 2, 91, " +
			"doi:10.3389/fchem.2014.00091, Introduction.",
		Checked: true,
		Note:    "States Tg ≈ 100 °C for polystyrene and −60 °C for poly(2-ethylhexyl acrylate).",
	},
	{
		ID:    SrcTgSupplierTable,
		Short: "a reagent supplier's table of homopolymer Tg (literature values)",
		Citation: "A reagent supplier's published reference table \"Thermal transitions of homopolymers: glass " +
			"transition and melting point\" (literature values, the most commonly reported ones); cited generically.",
		Checked: true,
		Note: "A secondary compilation. Read: acrylic acid 105 °C, acrylamide 165 °C, ethyl acrylate −24 °C, " +
			"acrylonitrile (syndiotactic) 125 °C. The table itself warns that values vary with molar mass, " +
			"tacticity, thermal history and method.",
	},
	{
		ID:    SrcTgRecalled,
		Short: "homopolymer Tg recalled from handbook tables",
		Citation: "Homopolymer glass transition temperatures recalled from handbook tables (Polymer Handbook, 4th ed., " +
			"Wiley 1999), not re-read here.",
		Checked: false,
		Note: UncheckedMark + ". Handbooks disagree by several kelvin, more for polar or hydrogen-bonding polymers; " +
			"molar mass, tacticity, water and residual monomer all shift Tg. Fox estimates are rough: override a " +
			"value with your own DSC data.",
	},
	{
		ID:    SrcGroupsFormula,
		Short: "counted from the structural formula",
		Citation: "Counted from the structural formula of the monomer unit (one OH per hydroxyalkyl (meth)acrylate unit, " +
			"one COOH per acrylic or methacrylic acid unit).",
		Checked: true,
		Note: "Hydroxyl value and acid value are mg KOH per g of polymer (M(KOH) = 56.105 g/mol from the IUPAC 2021 " +
			"abridged atomic weights). A hydroxyl value by the phthalic-anhydride/pyridine titration also titrates " +
			"acid groups and is corrected with the acid value.",
	},
	{
		ID:    SrcAnhydrideAcid,
		Short: "ASTM D3643-98 (acid number); ISO 2114 methods A and B",
		Citation: "ASTM D3643-98, Standard Test Method for Acid Number of Certain Alkali-Soluble Resins, section 3.1.1 " +
			"(discussion): \"If carboxylic anhydrides are present, only half of these groups will be titrated\"; and " +
			"ISO 2114 (partial and total acid value of polyester resins and of paint binders) as summarised by a " +
			"testing laboratory: method A (toluene–ethanol) titrates the carboxyl groups and half of the anhydride, " +
			"method B (pyridine–methyl ethyl ketone–water) all of it.",
		Checked: true,
		Note: "An anhydride unit can give two carboxyl groups. In an alcoholic titration it opens to a half ester and " +
			"counts as one acid (the partial acid value, Acid = 1); hydrolysed, it counts as two (the total acid " +
			"value, AcidTotal = 2). State which acid value you mean.",
	},
	{
		ID:    SrcQEReference,
		Short: "the reference of the Q–e scale",
		Citation: "IUPAC Gold Book, \"Q-e scheme\" (Pure Appl. Chem. 2008, 80, 2163, p. 2182), for the equations; and " +
			"Hōsoku no jiten (Dictionary of laws), Asakura Shoten, entry \"Alfrey–Price scheme\", read on kotobank.jp, " +
			"for styrene as the reference with Q = 1.0 and e = −0.8.",
		Checked: true,
		Note:    "Styrene's Q and e are fixed by convention; every other monomer's values are measured against it.",
	},
	{
		ID:    SrcQERecalled,
		Short: "Q–e values recalled from the Greenley compilation",
		Citation: "Q and e values recalled from R. Z. Greenley's compilation \"Q and e values for free radical " +
			"copolymerizations of vinyl monomers and telogens\" (Polymer Handbook, 4th ed., Wiley 1999, section II) " +
			"as quoted in textbooks, not re-read here.",
		Checked: false,
		Note: UncheckedMark + ". Q–e predictions are screening estimates only, often off by a factor of two or more; " +
			"measured reactivity ratios always take precedence.",
	},
	{
		ID:    SrcHandbookRatios,
		Short: "Polymer Handbook, Greenley's reactivity-ratio table",
		Citation: "R. Z. Greenley, \"Free radical copolymerization reactivity ratios\", in Polymer Handbook, 4th ed., " +
			"J. Brandrup, E. H. Immergut, E. A. Grulke, eds. (Wiley 1999), section II, Table 1; reference numbers as " +
			"given with each pair. Read from a public OCR transcription of the table.",
		Checked: false,
		Note: UncheckedMark + ". The transcription has no temperature column and a few rows with shifted columns; the " +
			"conditions (temperature, solvent, conversion) of these pairs are not given in the table as transcribed — " +
			"look them up in the paper the table cites before relying on a pair. Values for one pair scatter between " +
			"studies by ±20 % or more.",
	},
	{
		ID:    SrcStEHA2004,
		Short: "J. Appl. Polym. Sci. 2004, 92, 3368",
		Citation: "\"Determination of monomer reactivity ratios in styrene/2-ethylhexylacrylate copolymer\", J. Appl. " +
			"Polym. Sci. 2004, 92, 3368–3370 (abstract).",
		Checked: true,
		Note: "Bulk, 80 °C, ¹H NMR composition, error-in-variables estimate rS = 0.979, rEHA = 0.292; azeotrope at " +
			"f(styrene) = 0.972.",
	},
	{
		ID:    SrcJordan1960,
		Short: "Jordan, Doughty, Port, J. Appl. Polym. Sci. 1960",
		Citation: "E. F. Jordan, K. M. Doughty, W. S. Port, \"Polymerizable derivatives of long-chain alcohols. II. " +
			"Reactivity ratios for the copolymerization of some alkyl acrylates\", J. Appl. Polym. Sci. 1960, 4, " +
			"doi:10.1002/app.1960.070041111 (abstract).",
		Checked: true,
		Note: "Acrylonitrile (M1) with butyl acrylate: r1 = 1.52 ± 0.03, r2 = 0.75 ± 0.18. The abstract gives no " +
			"temperature or medium.",
	},
	{
		ID:    SrcMukherjee1998,
		Short: "Mukherjee, Chatterjee, Brar, Dutta, Macromolecules 1998, 31, 8455",
		Citation: "M. Mukherjee, S. K. Chatterjee, A. S. Brar, K. Dutta, \"Compositional and stereochemical analysis of " +
			"acrylamide/vinyl acetate copolymers by one- and two-dimensional NMR spectroscopy\", Macromolecules 1998, " +
			"31, 8455–8462 (abstract).",
		Checked: true,
		Note: "Solution polymerization, benzoyl peroxide initiator, composition from nitrogen content; Kelen–Tüdős and " +
			"error-in-variables estimates rA = 9.28 ± 0.6, rV = 0.09 ± 0.006. The abstract gives no temperature.",
	},
	{
		ID:    SrcIdowu2019,
		Short: "Idowu and Hutchinson, Polymers 2019, 11, 487",
		Citation: "L. A. Idowu, R. A. Hutchinson, \"Solvent effects on radical copolymerization kinetics of " +
			"2-hydroxyethyl methacrylate and butyl methacrylate\", Polymers 2019, 11(3), 487, " +
			"doi:10.3390/polym11030487 (open access), section 3.1.",
		Checked: true,
		Note: "Bulk HEMA/BMA; copolymer made at 50 °C (a few samples at 80 °C, composition found independent of " +
			"temperature in this range); rHEMA = 2.27 ± 0.18, rBMA = 0.66 ± 0.06 (95 %). Solvents change the " +
			"ratios strongly (hydrogen bonding of HEMA): in n-butanol or DMF the pair is much closer to ideal.",
	},
	{
		ID:    SrcStBANMP2004,
		Short: "J. Polym. Sci. A Polym. Chem. 2004, 42, 4168",
		Citation: "Article on the nitroxide-mediated copolymerization of styrene and n-butyl acrylate, J. Polym. Sci. " +
			"Part A: Polym. Chem. 2004, 42, 4168–4176 (abstract read in a library catalogue record, which does not " +
			"show the title).",
		Checked: true,
		Note: "Controlled (nitroxide DEPN with AIBN) copolymerization at 120 °C; rS = 0.74, rBA = 0.29; the terminal " +
			"model describes the composition.",
	},
	{
		ID:    SrcAAEA,
		Short: "Kobunshi Ronbunshu vol. 38, no. 6, p. 413",
		Citation: "Article on the radical copolymerization of acrylic acid with ethyl acrylate with and without carbon " +
			"tetrabromide, Kobunshi Ronbunshu vol. 38, no. 6, p. 413 (abstract read on J-STAGE).",
		Checked: true,
		Note:    "Dioxane, 50 °C: rAA = 0.91, rEA = 1.02, the same with and without the chain-transfer agent.",
	},
}

// Sources returns the table of sources the built-in data cite. The slice is a copy.
func Sources() []Source {
	return append([]Source(nil), sourceTable...)
}

// SourceOf returns the source with the given ID, and whether there is one.
func SourceOf(id string) (Source, bool) {
	for _, s := range sourceTable {
		if s.ID == id {
			return s, true
		}
	}
	return Source{}, false
}

// cite returns the per-value source text of a value that cites source id: the source's short
// label, the detail (what in the source, e.g. a monograph or reference number), and for an
// unchecked source the UncheckedTag; "" for id "" (a value not given). It panics on an unknown
// id, a broken invariant of the built-in tables that the tests catch.
func cite(id, detail string) string {
	if id == "" {
		return ""
	}
	s, ok := SourceOf(id)
	if !ok {
		panic("copoly: unknown source id " + id)
	}
	var b strings.Builder
	b.WriteString(s.Short)
	if detail != "" {
		b.WriteString(", ")
		b.WriteString(detail)
	}
	if !s.Checked {
		b.WriteString(" (")
		b.WriteString(UncheckedTag)
		b.WriteString(")")
	}
	return b.String()
}
