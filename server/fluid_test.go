package server

import (
	"context"
	"encoding/json"
	"net/http"
	"net/url"
	"strconv"
	"strings"
	"testing"

	"github.com/PuerkitoBio/goquery"
	"gonum.org/v1/gonum/floats/scalar"

	"fogbench/calc/fluid"
)

// userLiquidForm is an invented user liquid typed into the form, with
// n-heptane's published coefficients (Perry's 8th ed. tables, as the
// built-in entry uses) so it passes every consistency check.
func userLiquidForm() url.Values {
	v := url.Values{
		"id": {"plant-solvent"}, "name": {"Plant solvent"}, "reference": {"test sheet"},
		"molar_mass_kg_mol": {"0.100204"}, "normal_boiling_point_k": {"371.55"}, "melting_point_k": {"182.57"},
		"critical_temperature_k": {"540.2"}, "critical_pressure_pa": {"2.74e6"}, "critical_volume_m3_mol": {"428e-6"},
		"diffusion_volume": {"148.26"},
	}
	row := func(p, form string, kv ...string) {
		v.Set(p+".form", form)
		for i := 0; i < len(kv); i += 2 {
			v.Set(p+"."+kv[i], kv[i+1])
		}
	}
	row("vapor_pressure", "dippr101", "a", "87.829", "b", "-6996.4", "c", "-9.8802", "d", "7.2099e-06", "e", "2", "t_min_k", "182.57", "t_max_k", "540.2")
	row("liquid_density", "dippr105", "a", "612.59", "b", "0.26211", "c", "540.2", "d", "0.28141", "t_min_k", "182.57", "t_max_k", "540.2")
	row("surface_tension", "power", "a", "0.0522", "b", "1.24", "t_min_k", "183", "t_max_k", "540")
	row("liquid_viscosity", "dippr101", "a", "-9.4622", "b", "877.07", "c", "-0.23445", "d", "1.4022e+22", "e", "-10", "t_min_k", "182.57", "t_max_k", "432.16")
	row("latent_heat", "dippr106", "a", "50014", "b", "0.38795", "t_min_k", "182.57", "t_max_k", "540.2")
	row("liquid_heat_capacity", "constant", "value", "2240", "t_min_k", "200", "t_max_k", "400")
	row("vapor_heat_capacity", "poling", "a", "9.634", "b", "0.004156", "c", "0.00015494", "d", "-2.0066e-07", "e", "7.77e-11", "t_min_k", "200", "t_max_k", "1000")
	return v
}

func TestFluidsPageListsLiquidsWithPlots(t *testing.T) {
	ts, _ := newTestServer(t)
	c := client(t)
	doc, code := getDoc(t, c, ts.URL+"/fluids?t=30&t_unit=%C2%B0C")
	if code != http.StatusOK {
		t.Fatalf("status %d", code)
	}
	if n, want := doc.Find(`[data-testid=fluid-row]`).Length(), len(fluid.Liquids()); n != want {
		t.Fatalf("%d liquid rows, want %d", n, want)
	}
	// Water at 30 °C: IAPWS-IF97 saturation pressure 4246.688 Pa
	// (python3-iapws 1.5.2, testdata/fluid/water_iapws.csv row 303.15 K);
	// the table shows 4 significant figures in kPa.
	const psatTol = 5e-4
	cell := doc.Find(`[data-testid=fluid-row][data-id=water] td`).Eq(2).Text()
	got, err := strconv.ParseFloat(cell, 64)
	if err != nil || !scalar.EqualWithinRel(got, 4.246688, psatTol) {
		t.Errorf("water p_sat cell %q kPa, want 4.2467", cell)
	}
	if doc.Find(`[data-testid=plot-cmp-vapor-pressure] svg`).Length() != 1 {
		t.Error("vapor-pressure comparison plot missing")
	}
	// Past water's critical point the row says so instead of numbers.
	doc, _ = getDoc(t, c, ts.URL+"/fluids?t=400&t_unit=%C2%B0C")
	if msg := doc.Find(`[data-testid=fluid-row][data-id=water] [data-testid=fluid-error]`).Text(); !strings.Contains(msg, "critical") {
		t.Errorf("water at 400 °C: %q", msg)
	}
	// A temperature that is not a number is marked beside the box.
	doc, _ = getDoc(t, c, ts.URL+"/fluids?t=warm")
	if doc.Find(`[data-testid=error-t]`).Length() != 1 {
		t.Error("bad temperature not marked")
	}
	if v, _ := doc.Find(`#f-t`).Attr("value"); v != "warm" {
		t.Errorf("typed temperature not kept: %q", v)
	}
}

func TestFluidPageShowsSourcesAndWarnings(t *testing.T) {
	ts, _ := newTestServer(t)
	doc, code := getDoc(t, client(t), ts.URL+"/fluids/n-heptane?t=25&t_unit=%C2%B0C")
	if code != http.StatusOK {
		t.Fatalf("status %d", code)
	}
	l, _ := fluid.Lookup("n-heptane")
	if n := doc.Find(`[data-testid=sources] tbody tr`).Length(); n != len(l.Sources()) {
		t.Errorf("%d source rows, want %d", n, len(l.Sources()))
	}
	if doc.Find(`[data-testid=prop-table] tr[data-key=surface_tension_n_m]`).Length() != 1 {
		t.Error("surface tension row missing")
	}
	for _, id := range []string{"vapor-pressure", "surface-tension", "density", "viscosity", "latent-heat", "heat-capacity"} {
		if doc.Find(`[data-testid=plot-`+id+`] svg`).Length() != 1 {
			t.Errorf("plot %s missing", id)
		}
	}
	if doc.Find(`[data-testid=warnings]`).Length() != 0 {
		t.Error("25 °C is inside heptane's range, yet warnings show")
	}
	// Above the viscosity correlation's range (432 K) but below Tc: values
	// with a warning.
	doc, _ = getDoc(t, client(t), ts.URL+"/fluids/n-heptane?t=470&t_unit=K")
	if !strings.Contains(doc.Find(`[data-testid=warnings]`).Text(), "viscosity") {
		t.Errorf("no viscosity range warning at 470 K: %q", doc.Find(`[data-testid=warnings]`).Text())
	}
	_, code = getDoc(t, client(t), ts.URL+"/fluids/no-such-liquid")
	if code != http.StatusNotFound {
		t.Errorf("unknown liquid: %d", code)
	}
}

func TestAPIFluids(t *testing.T) {
	ts, _ := newTestServer(t)
	resp, err := http.Get(ts.URL + "/api/fluids")
	if err != nil {
		t.Fatal(err)
	}
	var list struct {
		Fluids []fluidJSON `json:"fluids"`
	}
	json.NewDecoder(resp.Body).Decode(&list)
	resp.Body.Close()
	if len(list.Fluids) != len(fluid.Liquids()) || list.Fluids[0].ID != "water" || list.Fluids[0].TMaxK <= list.Fluids[0].TMinK {
		t.Fatalf("list %+v", list.Fluids)
	}
	get := func(q string) (int, map[string]json.RawMessage) {
		resp, err := http.Get(ts.URL + q)
		if err != nil {
			t.Fatal(err)
		}
		defer resp.Body.Close()
		var body map[string]json.RawMessage
		json.NewDecoder(resp.Body).Decode(&body)
		return resp.StatusCode, body
	}
	code, body := get("/api/fluids/water?t_k=298.15")
	var p fluid.Properties
	json.Unmarshal(body["properties"], &p)
	w, _ := fluid.Lookup("water")
	if code != 200 || p.SaturationPressurePa != w.SaturationPressure(298.15) || len(body["sources"]) < 10 {
		t.Fatalf("water at 298.15 K: %d %+v", code, p)
	}
	// Outside heptane's viscosity range: 200 with a warning.
	code, body = get("/api/fluids/n-heptane?t_k=470")
	var warns []string
	json.Unmarshal(body["warnings"], &warns)
	if code != 200 || len(warns) == 0 {
		t.Fatalf("heptane at 470 K: %d %v", code, warns)
	}
	// Past the critical temperature, or no temperature: 400 naming t_k.
	for _, q := range []string{"/api/fluids/water?t_k=700", "/api/fluids/water", "/api/fluids/water?t_k=NaN"} {
		code, body = get(q)
		var fields []map[string]string
		json.Unmarshal(body["fields"], &fields)
		if code != 400 || len(fields) == 0 || fields[0]["field"] != "t_k" {
			t.Errorf("%s: %d %s", q, code, body["fields"])
		}
	}
	if code, _ = get("/api/fluids/nope?t_k=300"); code != 404 {
		t.Errorf("unknown liquid: %d", code)
	}
}

// A user liquid goes through the form into the store, appears on the
// liquids page and in the case form, and a case saved with it carries its
// definition.
func TestUserLiquidFormAndCase(t *testing.T) {
	ts, st := newTestServer(t)
	c := client(t)
	// Bad input comes back as typed with messages beside the fields.
	bad := userLiquidForm()
	bad.Set("molar_mass_kg_mol", "heavy")
	bad.Set("surface_tension.form", "cubic")
	resp := postForm(t, c, ts.URL+"/fluids/custom", bad)
	doc, _ := goquery.NewDocumentFromReader(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusUnprocessableEntity || doc.Find(`[data-testid=error-molar_mass_kg_mol]`).Length() != 1 {
		t.Fatalf("unparsable molar mass: %d", resp.StatusCode)
	}
	if v, _ := doc.Find(`#f-molar_mass_kg_mol`).Attr("value"); v != "heavy" {
		t.Errorf("typed value not kept: %q", v)
	}
	bad.Set("molar_mass_kg_mol", "0.100204")
	resp = postForm(t, c, ts.URL+"/fluids/custom", bad)
	doc, _ = goquery.NewDocumentFromReader(resp.Body)
	resp.Body.Close()
	if resp.StatusCode != http.StatusUnprocessableEntity || doc.Find(`[data-testid=error-surface_tension]`).Length() != 1 {
		t.Fatalf("unknown form not marked on its row: %d", resp.StatusCode)
	}
	if list, _ := st.ListLiquids(context.Background()); len(list) != 0 {
		t.Fatal("a rejected liquid was stored")
	}

	resp = postForm(t, c, ts.URL+"/fluids/custom", userLiquidForm())
	resp.Body.Close()
	if resp.StatusCode != http.StatusSeeOther || resp.Header.Get("Location") != "/fluids/plant-solvent" {
		t.Fatalf("create: %d %s", resp.StatusCode, resp.Header.Get("Location"))
	}
	doc, code := getDoc(t, c, ts.URL+"/fluids/plant-solvent")
	if code != 200 || doc.Find(`[data-testid=fluid-name]`).Text() != "Plant solvent" || doc.Find(`[data-testid=spec-json]`).Length() != 1 {
		t.Fatalf("user liquid page: %d", code)
	}
	doc, _ = getDoc(t, c, ts.URL+"/fluids")
	if doc.Find(`[data-testid=fluid-row][data-id=plant-solvent]`).Length() != 1 {
		t.Error("user liquid not on the liquids page")
	}
	// Edit: the stored values come back; a change saves revision 2.
	doc, _ = getDoc(t, c, ts.URL+"/fluids/custom/plant-solvent/edit")
	if v, _ := doc.Find(`input[name="liquid_heat_capacity.value"]`).Attr("value"); v != "2240" {
		t.Errorf("edit form cp = %q", v)
	}
	edit := userLiquidForm()
	edit.Set("revision", "1")
	edit.Set("liquid_heat_capacity.value", "2250")
	resp = postForm(t, c, ts.URL+"/fluids/custom/plant-solvent", edit)
	resp.Body.Close()
	if rec, _ := st.GetLiquid(context.Background(), "plant-solvent"); resp.StatusCode != http.StatusSeeOther || rec.Revision != 2 || rec.Spec.LiquidHeatCapacity.Value != 2250 {
		t.Fatalf("update: %d rev %d", resp.StatusCode, rec.Revision)
	}

	// The case form offers it; a case saved with it embeds the definition.
	doc, _ = getDoc(t, c, ts.URL+"/cases/new")
	if doc.Find(`#f-fluid option[value=plant-solvent]`).Length() != 1 {
		t.Fatal("case form does not offer the user liquid")
	}
	form := validForm()
	form.Set("fluid", "plant-solvent")
	resp = postForm(t, c, ts.URL+"/cases", form)
	resp.Body.Close()
	m := caseURL.FindStringSubmatch(resp.Header.Get("Location"))
	if resp.StatusCode != http.StatusSeeOther || m == nil {
		t.Fatalf("save case with user liquid: %d", resp.StatusCode)
	}
	rec, err := st.GetCase(context.Background(), mustInt(t, m[1]))
	if err != nil || rec.Case.CustomFluid == nil || rec.Case.CustomFluid.LiquidHeatCapacity.Value != 2250 {
		t.Fatalf("case does not carry the liquid: %+v %v", rec.Case.CustomFluid, err)
	}
	// Deleting the liquid leaves the case computable, and its edit form
	// still offers the case's own liquid.
	resp = postForm(t, c, ts.URL+"/fluids/custom/plant-solvent/delete", url.Values{})
	resp.Body.Close()
	doc, _ = getDoc(t, c, ts.URL+"/cases/"+m[1])
	if doc.Find(`[data-testid=compute-error]`).Length() != 0 {
		t.Fatalf("case broke when its liquid was deleted: %s", doc.Find(`[data-testid=compute-error]`).Text())
	}
	if doc.Find(`[data-testid=properties-table]`).Length() != 1 || !strings.Contains(doc.Find(`[data-testid=properties-sources]`).Text(), "user data: test sheet") {
		t.Error("properties-used table or its user source missing")
	}
	doc, _ = getDoc(t, c, ts.URL+"/cases/"+m[1]+"/edit")
	if sel, _ := doc.Find(`#f-fluid option[selected]`).Attr("value"); sel != "plant-solvent" {
		t.Errorf("edit form selects %q, not the case's own liquid", sel)
	}
	if v, _ := doc.Find(`input[name=custom_fluid_json]`).Attr("value"); !strings.Contains(v, `"plant-solvent"`) {
		t.Error("the case's liquid definition does not travel with the form")
	}
}
