package org.outstage.model;

import java.util.ArrayList;
import java.util.List;

/**
 * A stage as a small circuit: fixed nodes (ground, rails, the two drive points) and unknown nodes, with
 * resistors and transistors between them. KCL residuals and their Jacobian are assembled over all nodes;
 * the solver uses the block of unknown nodes and, for the gain, the columns of the drive nodes.
 */
final class Circuit {
    static final int GND = 0, VPOS = 1, VNEG = 2, DRIVE_TOP = 3, DRIVE_BOTTOM = 4, FIRST_UNKNOWN = 5;

    record Resistor(String name, int a, int b, double ohms) {}

    record Bjt(String name, String role, boolean npn, int c, int b, int e, DeviceParameters device, boolean isOutput, boolean upper) {}

    final StageParameters params;
    final List<String> nodeNames = new ArrayList<>(List.of("0", "vpos", "vneg", "dtop", "dbot"));
    final List<Resistor> resistors = new ArrayList<>();
    final List<Bjt> bjts = new ArrayList<>();
    final int out;
    int emitterResistorTop = -1, emitterResistorBottom = -1;
    final double vt;

    private Circuit(StageParameters p) {
        this.params = p;
        this.vt = p.thermalVolts();
        this.out = node("out");
    }

    int nodeCount() { return nodeNames.size(); }

    int unknownCount() { return nodeNames.size() - FIRST_UNKNOWN; }

    private int node(String name) {
        nodeNames.add(name);
        return nodeNames.size() - 1;
    }

    private void resistor(String name, int a, int b, double ohms) {
        if (Double.isFinite(ohms)) resistors.add(new Resistor(name, a, b, ohms));
    }

    static Circuit of(StageParameters p) {
        Circuit c = new Circuit(p);
        DeviceParameters drv = p.driver(), outp = p.output();
        double re = p.emitterOhms();
        Topology t = p.topology();
        if (t instanceof Topology.Pair) {
            int e1 = c.node("e1"), e2 = c.node("e2");
            c.bjts.add(new Bjt("Q1", "upper output", true, VPOS, DRIVE_TOP, e1, outp, true, true));
            c.emitterResistorTop = c.resistors.size();
            c.resistor("RE1", e1, c.out, re);
            c.bjts.add(new Bjt("Q2", "lower output", false, VNEG, DRIVE_BOTTOM, e2, outp, true, false));
            c.emitterResistorBottom = c.resistors.size();
            c.resistor("RE2", e2, c.out, re);
        } else if (t instanceof Topology.Darlington d) {
            c.darlingtonTop(drv, outp, re, d.driverEmitterOhms());
            c.darlingtonBottom(drv, outp, re, d.driverEmitterOhms());
        } else if (t instanceof Topology.Cfp f) {
            c.cfpTop(drv, outp, re, f.outputBaseEmitterOhms(), f.emitterResistorInLoop());
            c.cfpBottom(drv, outp, re, f.outputBaseEmitterOhms(), f.emitterResistorInLoop());
        } else if (t instanceof Topology.Quasi q) {
            c.darlingtonTop(drv, outp, re, q.driverEmitterOhms());
            c.cfpBottom(drv, outp, re, q.outputBaseEmitterOhms(), q.emitterResistorInLoop());
        }
        c.resistor("RL", c.out, GND, p.loadOhms());
        return c;
    }

    private void darlingtonTop(DeviceParameters drv, DeviceParameters outp, double re, double rd) {
        int b = node("b3"), e = node("e3");
        bjts.add(new Bjt("Q1", "upper driver", true, VPOS, DRIVE_TOP, b, drv, false, true));
        resistor("RD1", b, out, rd);
        bjts.add(new Bjt("Q3", "upper output", true, VPOS, b, e, outp, true, true));
        emitterResistorTop = resistors.size();
        resistor("RE1", e, out, re);
    }

    private void darlingtonBottom(DeviceParameters drv, DeviceParameters outp, double re, double rd) {
        int b = node("b4"), e = node("e4");
        bjts.add(new Bjt("Q2", "lower driver", false, VNEG, DRIVE_BOTTOM, b, drv, false, false));
        resistor("RD2", b, out, rd);
        bjts.add(new Bjt("Q4", "lower output", false, VNEG, b, e, outp, true, false));
        emitterResistorBottom = resistors.size();
        resistor("RE2", e, out, re);
    }

    private void cfpTop(DeviceParameters drv, DeviceParameters outp, double re, double rbe, boolean reInLoop) {
        int b = node("b3"), col = node("c3");
        bjts.add(new Bjt("Q1", "upper driver", true, b, DRIVE_TOP, reInLoop ? out : col, drv, false, true));
        bjts.add(new Bjt("Q3", "upper output", false, col, b, VPOS, outp, true, true));
        resistor("RBE1", b, VPOS, rbe);
        emitterResistorTop = resistors.size();
        resistor("RE1", col, out, re);
    }

    private void cfpBottom(DeviceParameters drv, DeviceParameters outp, double re, double rbe, boolean reInLoop) {
        int b = node("b4"), col = node("c4");
        bjts.add(new Bjt("Q2", "lower driver", false, b, DRIVE_BOTTOM, reInLoop ? out : col, drv, false, false));
        bjts.add(new Bjt("Q4", "lower output", true, col, b, VNEG, outp, true, false));
        resistor("RBE2", b, VNEG, rbe);
        emitterResistorBottom = resistors.size();
        resistor("RE2", col, out, re);
    }

    /**
     * Assembles KCL residuals f (current leaving each node into the elements) and the Jacobian j
     * (df/dv, row-major nodeCount × nodeCount) at node voltages v. Adds {@code gshunt} from every unknown
     * node to ground (gmin stepping). {@code work} is scratch of length 5.
     */
    void assemble(double[] v, double gshunt, double[] f, double[] j, double[] work) {
        int n = nodeCount();
        java.util.Arrays.fill(f, 0);
        java.util.Arrays.fill(j, 0);
        for (Resistor r : resistors) {
            double g = 1 / r.ohms();
            double i = (v[r.a()] - v[r.b()]) * g;
            f[r.a()] += i;
            f[r.b()] -= i;
            j[r.a() * n + r.a()] += g;
            j[r.a() * n + r.b()] -= g;
            j[r.b() * n + r.a()] -= g;
            j[r.b() * n + r.b()] += g;
        }
        for (Bjt q : bjts) {
            double s = q.npn() ? 1 : -1;
            int c = q.c(), b = q.b(), e = q.e();
            double vbe = s * (v[b] - v[e]);
            double vce = s * (v[c] - v[e]);
            DeviceLaw.evaluate(q.device(), vt, vbe, vce, work);
            double ic = work[0], ib = work[1], gm = work[2], go = work[3], gpi = work[4];
            f[c] += s * ic;
            f[b] += s * ib;
            f[e] -= s * (ic + ib);
            // d(s·ic)/dv[b] = gm, /dv[c] = go, /dv[e] = -(gm + go); likewise for ib.
            j[c * n + b] += gm;
            j[c * n + c] += go;
            j[c * n + e] -= gm + go;
            j[b * n + b] += gpi;
            j[b * n + e] -= gpi;
            j[e * n + b] -= gm + gpi;
            j[e * n + c] -= go;
            j[e * n + e] += gm + go + gpi;
        }
        if (gshunt > 0) {
            for (int k = FIRST_UNKNOWN; k < n; k++) {
                f[k] += gshunt * v[k];
                j[k * n + k] += gshunt;
            }
        }
    }

    /** Collector and base currents of each transistor, in its own polarity (positive when conducting). */
    double[][] deviceCurrents(double[] v) {
        double[] work = new double[5];
        double[][] r = new double[bjts.size()][];
        for (int k = 0; k < bjts.size(); k++) {
            Bjt q = bjts.get(k);
            double s = q.npn() ? 1 : -1;
            DeviceLaw.evaluate(q.device(), vt, s * (v[q.b()] - v[q.e()]), s * (v[q.c()] - v[q.e()]), work);
            r[k] = new double[] {work[0], work[1]};
        }
        return r;
    }

    double resistorCurrent(int index, double[] v) {
        Resistor r = resistors.get(index);
        return (v[r.a()] - v[r.b()]) / r.ohms();
    }
}
