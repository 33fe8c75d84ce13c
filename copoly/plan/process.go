package plan

import (
	"fmt"

	"copoly/copoly"
)

// processData fills the heats and densities the input leaves to the built-in monomers it names
// (see [Input.Monomer1]) and returns their hazard classes, and a note for each name that is not
// in the list.
func (in *Input) processData() ([]MonomerHazards, []string) {
	in.heat1, in.heat2 = orZero(in.Heat1), orZero(in.Heat2)
	var hazards []MonomerHazards
	var notes []string
	for i, m := range []struct {
		name    string
		given   *float64
		heat    *float64
		density *float64
	}{{in.Monomer1, in.Heat1, &in.heat1, &in.Density1}, {in.Monomer2, in.Heat2, &in.heat2, &in.Density2}} {
		if m.name == "" {
			continue
		}
		pr, ok := copoly.PropertiesOf(m.name)
		if !ok {
			notes = append(notes, fmt.Sprintf("monomer%d %q is not in the built-in list: no density, heat of polymerization or hazards were taken for it.", i+1, m.name))
			continue
		}
		if m.given == nil {
			*m.heat = pr.HeatOfPolymerization
		}
		if *m.density == 0 && pr.State == copoly.StateLiquid && pr.Density > 0 {
			*m.density = pr.Density
		}
		hazards = append(hazards, MonomerHazards{Monomer: m.name, Hazards: append([]string{}, pr.Hazards...)})
	}
	return hazards, notes
}
