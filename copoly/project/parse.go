package project

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"reflect"
	"strings"

	"copoly/copoly"
)

// MaxFileBytes is the largest project file Parse reads. A valid project is far smaller (the
// notes are limited to MaxNotesBytes); the limit stops a wrong file from using up memory.
const MaxFileBytes = 1 << 20

// required lists the keys a project file must hold (with a non-null value). The text fields
// and the optional flags default to "" and false.
var required = []string{"format", "version", "monomer1", "monomer2", "r1", "r2", "f10", "conversion", "tolerance"}

// Parse reads one project file and validates it.
//
// The data must be a single JSON object (surrounding white space allowed, nothing after it)
// whose "format" is Format. Anything else, including valid JSON of another kind, gives an
// error wrapping ErrNotProject. A "version" above Version gives an error wrapping
// ErrNewerVersion. A required key that is missing or null gives ErrMissing, a value of the
// wrong JSON type ErrWrongType; both name the key ("project.monomer1.molarMass"). Keys this
// version does not know are ignored. Finally the project must pass Project.Validate.
func Parse(data []byte) (Project, error) {
	if len(data) > MaxFileBytes {
		return Project{}, notProject(fmt.Sprintf("the file holds %d bytes, more than the %d a project can have", len(data), MaxFileBytes))
	}
	if len(bytes.TrimSpace(data)) == 0 {
		return Project{}, notProject("the file is empty")
	}

	// First pass: the top-level object only, to tell a foreign file from a damaged project.
	dec := json.NewDecoder(bytes.NewReader(data))
	var head map[string]json.RawMessage
	if err := dec.Decode(&head); err != nil {
		var typeErr *json.UnmarshalTypeError
		if errors.As(err, &typeErr) {
			return Project{}, notProject(fmt.Sprintf("the file holds a JSON %s, not an object", typeErr.Value))
		}
		return Project{}, notProject("the file is not valid JSON (" + err.Error() + ")")
	}
	if head == nil { // the literal null
		return Project{}, notProject("the file holds a JSON null, not an object")
	}
	if _, err := dec.Token(); err != io.EOF {
		return Project{}, notProject("unexpected data after the end of the project object")
	}

	var format string
	if raw, ok := head["format"]; !ok || json.Unmarshal(raw, &format) != nil || format != Format {
		return Project{}, notProject(`it has no "format": "` + Format + `" entry`)
	}
	var version float64
	if raw := head["version"]; isNull(raw) {
		return Project{}, missing("project.version")
	} else if err := json.Unmarshal(raw, &version); err != nil {
		return Project{}, &copoly.FieldError{Field: "project.version", Reason: "must be a whole number", Err: ErrWrongType}
	}
	if err := checkVersion(version); err != nil {
		// A newer file may be laid out differently: stop before reading the rest.
		return Project{}, err
	}
	for _, key := range required {
		if isNull(head[key]) {
			return Project{}, missing("project." + key)
		}
	}

	// encoding/json fills a short JSON array into a [2]float64 with zeros and drops the extra
	// elements of a long one; a JCR point and a row of the plan's time table must be exactly
	// pairs. (encoding/json also matches keys regardless of case, hence EqualFold.)
	for key, raw := range head {
		if strings.EqualFold(key, "jcr") {
			if err := checkPairs("project.jcr", raw, "[r1, r2]"); err != nil {
				return Project{}, err
			}
		}
		var plan map[string]json.RawMessage
		if !strings.EqualFold(key, "plan") || json.Unmarshal(raw, &plan) != nil {
			continue
		}
		for k, rows := range plan {
			if strings.EqualFold(k, "timeTable") {
				if err := checkPairs("project.plan.timeTable", rows, "[time, conversion]"); err != nil {
					return Project{}, err
				}
			}
		}
	}

	var p Project
	if err := json.Unmarshal(data, &p); err != nil {
		var typeErr *json.UnmarshalTypeError
		if errors.As(err, &typeErr) {
			return Project{}, &copoly.FieldError{
				Field:  "project." + typeErr.Field,
				Reason: fmt.Sprintf("must be %s, not a JSON %s", kindName(typeErr.Type), typeErr.Value),
				Err:    ErrWrongType,
			}
		}
		return Project{}, notProject("the file is not valid JSON (" + err.Error() + ")")
	}
	if len(p.JCR) == 0 {
		p.JCR = nil // "jcr": [] is no region, as Marshal writes it (by leaving the key out)
	}
	if p.Plan != nil && len(p.Plan.TimeTable) == 0 {
		p.Plan.TimeTable = nil // likewise "timeTable": [] is no table
	}
	// Likewise "triads": [], "sizeBins": [], "userMonomers": [] and "hazards": [] are none.
	if len(p.Triads) == 0 {
		p.Triads = nil
	}
	if len(p.SizeBins) == 0 {
		p.SizeBins = nil
	}
	if len(p.UserMonomers) == 0 {
		p.UserMonomers = nil
	}
	for i := range p.UserMonomers {
		if len(p.UserMonomers[i].Hazards) == 0 {
			p.UserMonomers[i].Hazards = nil
		}
	}
	if err := p.Validate(); err != nil {
		return Project{}, err
	}
	return p, nil
}

// checkPairs reports the first entry of the JSON list raw that is a list of other than two
// values, naming it field[i]; anything else is left for json.Unmarshal to report.
func checkPairs(field string, raw json.RawMessage, pair string) error {
	if isNull(raw) {
		return nil
	}
	var entries []json.RawMessage
	if json.Unmarshal(raw, &entries) != nil {
		return nil
	}
	for i, e := range entries {
		var xy []json.RawMessage
		if json.Unmarshal(e, &xy) == nil && len(xy) != 2 {
			return &copoly.FieldError{Field: fmt.Sprintf("%s[%d]", field, i), Reason: fmt.Sprintf("must be a pair %s, not a list of %d values", pair, len(xy)), Err: ErrWrongType}
		}
	}
	return nil
}

// Marshal validates p and returns it as an indented project file ending in a newline, ready to
// save or export. Parse(Marshal(p)) gives p back. A project whose file would exceed
// MaxFileBytes (a full bench grid of long cells with long notes) gives an error with field
// "project" wrapping ErrTooLong rather than a file Parse would refuse.
func Marshal(p Project) ([]byte, error) {
	if err := p.Validate(); err != nil {
		return nil, err
	}
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetEscapeHTML(false)
	enc.SetIndent("", "  ")
	if err := enc.Encode(p); err != nil {
		return nil, fmt.Errorf("project: encoding %q: %w", p.Name, err)
	}
	if buf.Len() > MaxFileBytes {
		return nil, &copoly.FieldError{Field: "project", Reason: fmt.Sprintf("the project file would take %d bytes, more than the %d a project can have; shorten the notes or the bench data", buf.Len(), MaxFileBytes), Err: ErrTooLong}
	}
	return buf.Bytes(), nil
}

// Export returns p as a project file ([Marshal]) and a file name to save it under ([Filename]).
func Export(p Project) (data []byte, filename string, err error) {
	if data, err = Marshal(p); err != nil {
		return nil, "", err
	}
	return data, Filename(p.Name), nil
}

// Filename returns a file name for exporting a project called name: ASCII letters and digits
// of the name in lower case, every other run of characters replaced by one "-", at most 80
// characters, then ".copoly.json". An empty result becomes "copoly-project.copoly.json".
func Filename(name string) string {
	const maxStem = 80
	var b strings.Builder
	dash := false
	for _, r := range strings.ToLower(name) {
		if b.Len() >= maxStem {
			break
		}
		if ('a' <= r && r <= 'z') || ('0' <= r && r <= '9') {
			if dash && b.Len() > 0 {
				b.WriteByte('-')
			}
			dash = false
			b.WriteRune(r)
			continue
		}
		dash = true
	}
	stem := strings.TrimRight(b.String(), "-")
	if len(stem) > maxStem {
		stem = strings.TrimRight(stem[:maxStem], "-")
	}
	if stem == "" {
		stem = "copoly-project"
	}
	return stem + ".copoly.json"
}

func notProject(why string) error {
	return &copoly.FieldError{Field: "project", Reason: "not a copoly project file: " + why, Err: ErrNotProject}
}

func missing(field string) error {
	return &copoly.FieldError{Field: field, Reason: "is missing", Err: ErrMissing}
}

// isNull reports whether a raw JSON value is absent or the literal null.
func isNull(raw json.RawMessage) bool {
	return len(raw) == 0 || string(bytes.TrimSpace(raw)) == "null"
}

// kindName names a Go type as the JSON a user would have to write.
func kindName(t reflect.Type) string {
	switch t.Kind() {
	case reflect.Float64, reflect.Float32:
		return "a number"
	case reflect.Int, reflect.Int64, reflect.Int32:
		return "a whole number"
	case reflect.String:
		return "text in quotes"
	case reflect.Bool:
		return "true or false"
	case reflect.Struct, reflect.Map:
		return "an object"
	case reflect.Slice, reflect.Array:
		return "a list"
	default:
		return "a " + t.String()
	}
}
