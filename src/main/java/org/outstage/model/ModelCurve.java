package org.outstage.model;

import org.outstage.analysis.TransferCurve;

/** A predicted transfer curve (input = Vin, output = Vout, gain = dVout/dVin from the Jacobian) and the solver's report. */
public record ModelCurve(TransferCurve curve, SolveReport report) {}
