// Package atomize sizes atomizers from published correlations: the liquid
// flow against injection pressure (flow number, discharge coefficient), the
// Sauter mean diameter (SMD) of the spray, the cone angle and film thickness
// where a published method gives them, and the dimensionless groups that say
// which regime the atomizer runs in.
//
// Seven families are covered: plain-orifice, pressure-swirl, airblast
// (prefilming and plain-jet), air-assist, rotary, ultrasonic and
// effervescent. Evaluate computes one operating point, Solve finds the input
// that gives a target SMD or mass flow, Sweep tabulates SMD and flow against
// one input for plotting, and MonteCarlo propagates stated input
// uncertainties to SMD percentiles.
//
// Liquid and gas properties are plain SI numbers passed in by the caller
// (Properties), so the package depends on no other calc package except
// calc/valid (field errors) and calc/phys.
//
// Verification status: the forms were written from memory; each
// correlation and auxiliary relation carries a Provenance record (full
// citation; "checked against" the open text that confirmed it, or
// "published form not confirmed here: use the band"). No printed original
// was read, so a check is as good as the secondary text named in it. The
// tests check the code against hand arithmetic from the forms and against
// an independent NumPy evaluation of the same forms; they do not show that
// the forms match the papers. Only the flow-number definitions and unit
// conversions are exact. Results name every unconfirmed estimate in a
// warning. docs/methods-atomize.md lists what was read, where.
package atomize
