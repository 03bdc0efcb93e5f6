package buildcmd

import (
	"time"

	"biasbin/cmd/internal/buildjob"
	"biasbin/cmd/internal/report"
	"biasbin/picker/job"
	"biasbin/store"
)

// jsonBuild is one build in build list --json.
type jsonBuild struct {
	ID        int64  `json:"id"`
	Candidate string `json:"candidate"`
	Boards    int    `json:"boards"`
	State     string `json:"state"`
	Created   string `json:"created"`
	Note      string `json:"note"`
}

func listJSON(v buildjob.View) jsonBuild {
	return jsonBuild{ID: v.ID, Candidate: v.Candidate, Boards: v.Boards, State: string(v.State),
		Created: jsonTime(v.Created), Note: v.Note}
}

// jsonTime writes a time in UTC, RFC 3339.
func jsonTime(t time.Time) string {
	if t.IsZero() {
		return ""
	}
	return t.UTC().Format(time.RFC3339)
}

// jsonShow is build show --json: the list fields, with boards the record
// of every board of the run (measured or not).
type jsonShow struct {
	ID         int64              `json:"id"`
	Candidate  string             `json:"candidate"`
	State      string             `json:"state"`
	Created    string             `json:"created"`
	Ended      string             `json:"ended,omitempty"`
	Note       string             `json:"note"`
	BoardCount int                `json:"board_count"`
	Request    jsonRequest        `json:"request"`
	Figures    buildjob.Figures   `json:"figures"`
	Parts      []jsonPart         `json:"parts"`
	Bands      buildjob.Bands     `json:"bands"`
	Boards     []jsonBoard        `json:"boards"`
	Stage      map[string]float64 `json:"stage_ohms"`
	Transistor string             `json:"transistor"`
	Cautions   []jsonCaution      `json:"cautions"`
}

// jsonCaution is one hazard of the build: kind "supply" (value_v, limit_v)
// or "hot-part" (utilization of the design limit).
type jsonCaution struct {
	Kind        string  `json:"kind"`
	Value_V     float64 `json:"value_v,omitempty"`
	Limit_V     float64 `json:"limit_v,omitempty"`
	Utilization float64 `json:"utilization,omitempty"`
}

// cautionsJSON lists a build's cautions for --json.
func cautionsJSON(cs []job.Caution) []jsonCaution {
	out := []jsonCaution{}
	for _, c := range cs {
		switch c.Kind {
		case job.CautionSupply:
			out = append(out, jsonCaution{Kind: "supply", Value_V: c.Value, Limit_V: c.Limit})
		case job.CautionHotPart:
			out = append(out, jsonCaution{Kind: "hot-part", Utilization: c.Utilization})
		}
	}
	return out
}

// jsonRequest is what the build was picked for, SI.
type jsonRequest struct {
	Polarity string  `json:"polarity"`
	VCC_V    float64 `json:"vcc_v"` // the supply as a meter reads it against 0 V
	report.Reference
	VCCTol       float64  `json:"vcc_tol"`
	IC_A         float64  `json:"ic_a"`
	VCE_V        float64  `json:"vce_v,omitempty"`
	AmbientMin_C float64  `json:"ambient_min_c"`
	AmbientMax_C float64  `json:"ambient_max_c"`
	Boards       int      `json:"boards"`
	Pairs        bool     `json:"pairs"`
	RequireTags  []string `json:"require_tags,omitempty"`
	Load_Ohm     float64  `json:"load_ohms,omitempty"`
	Bypass       bool     `json:"bypass"`
}

// jsonPart is one line the build took parts from.
type jsonPart struct {
	Line     int64   `json:"line"`
	Bin      string  `json:"bin"`
	Kind     string  `json:"kind"`
	Ohms     float64 `json:"ohms,omitempty"`
	Label    string  `json:"label,omitempty"`
	PerBoard int     `json:"per_board"`
	Taken    int     `json:"taken"`
}

// jsonBoard is one board: its readings and verdict, or verdict
// "unmeasured" with null readings.
type jsonBoard struct {
	Board   int              `json:"board"`
	Time    string           `json:"time,omitempty"`
	VB_V    *float64         `json:"vb_v"`
	VE_V    *float64         `json:"ve_v"`
	VC_V    *float64         `json:"vc_v"`
	Verdict string           `json:"verdict"`
	InBand  *[3]bool         `json:"in_band,omitempty"`
	Explain *bool            `json:"explained,omitempty"`
	Causes  []buildjob.Cause `json:"causes"`
}

// unmeasured is the verdict of a board with no readings yet.
const unmeasured = "unmeasured"

func showJSON(v buildjob.View) jsonShow {
	p := v.Plan
	r := p.Request
	out := jsonShow{ID: v.ID, Candidate: v.Candidate, State: string(v.State), Created: jsonTime(v.Created),
		Ended: jsonTime(v.Ended), Note: v.Note, BoardCount: v.Boards,
		Request: jsonRequest{Polarity: p.Build.Device.Polarity.String(), VCC_V: p.Build.Ground.Supply_V(p.Build.VCC_V),
			Reference: report.ReferenceOf(p.Build.Device.Polarity, p.Build.Topology, p.Build.Ground), VCCTol: p.Build.VCCTol, IC_A: r.IC_A,
			VCE_V: r.VCE_V, AmbientMin_C: p.Build.AmbientMin_C, AmbientMax_C: p.Build.AmbientMax_C, Boards: max(1, r.Boards),
			Pairs: r.Pairs, RequireTags: r.RequireTags, Load_Ohm: r.RL_Ohm, Bypass: r.Bypass},
		Figures: p.Figures,
		Bands:   p.Bands, Parts: []jsonPart{}, Stage: map[string]float64{}, Transistor: p.Build.Device.Label,
		Cautions: cautionsJSON(p.Cautions)}
	for _, s := range p.Slots {
		out.Stage[s.Slot] = s.Ohm
	}
	for _, part := range v.Parts {
		jp := jsonPart{Line: part.Line, Bin: part.Bin, Kind: string(part.Kind), PerBoard: part.PerBoard, Taken: part.Taken}
		if part.Kind == store.KindResistor {
			jp.Ohms = part.Ohm
		} else {
			jp.Label = part.Label
		}
		out.Parts = append(out.Parts, jp)
	}
	for _, rd := range boardsOf(v) {
		jb := jsonBoard{Board: rd.Board, Verdict: unmeasured, Causes: []buildjob.Cause{}}
		if rd.Verdict != "" {
			jb.Time = jsonTime(rd.Time)
			jb.VB_V, jb.VE_V, jb.VC_V = &rd.VB_V, &rd.VE_V, &rd.VC_V
			jb.Verdict, jb.InBand, jb.Explain = string(rd.Verdict), &rd.InBand, &rd.Explained
			if rd.Causes != nil {
				jb.Causes = rd.Causes
			}
		}
		out.Boards = append(out.Boards, jb)
	}
	return out
}

// boardsOf returns a record for every board of the run, in board order:
// the recorded readings, or one with only Board set.
func boardsOf(v buildjob.View) []buildjob.Reading {
	out := make([]buildjob.Reading, v.Boards)
	for i := range out {
		out[i].Board = i + 1
	}
	for _, r := range v.Readings {
		if r.Board >= 1 && r.Board <= v.Boards {
			out[r.Board-1] = r
		}
	}
	return out
}
