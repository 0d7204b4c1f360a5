package dev.cairn.cli;

import dev.cairn.gravity.FieldModel;
import dev.cairn.gravity.HierarchicalField;
import dev.cairn.gravity.PolyhedronField;
import dev.cairn.body.BodyModel;
import dev.cairn.motion.Deployment;
import dev.cairn.motion.DeploymentSettings;
import dev.cairn.motion.Frame;
import dev.cairn.motion.Landing;
import dev.cairn.motion.MotionSettings;
import dev.cairn.motion.Propagator;
import dev.cairn.motion.Trajectory;
import dev.cairn.tables.BoxGrid;
import dev.cairn.tables.TableBuilder;
import dev.cairn.tables.TableField;
import dev.cairn.tables.TableLayout;
import dev.cairn.util.ProgressListener;
import java.io.PrintWriter;
import java.lang.management.ManagementFactory;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.Map;

/**
 * {@code cairn bench --motion}: speed of trajectory propagation and of the deployment Monte Carlo (figures, not
 * tests; docs/trajectories.md, "Speed").
 *
 * <p>Part 1, trajectories: four fixed initial states near the body (the worked example of docs/trajectories.md),
 * propagated for one day in the body frame at integrator tolerance 1e-10 on one thread with the exact direct sum,
 * the hierarchical field at 1e-6 and a tricubic table (50 m box grid with gradients, made in memory from the
 * hierarchical field); printed: steps per second and field evaluations per trajectory. Part 2, deployment: the
 * demo deployment (release (0, 0, 750) m at (0.02, 0, −0.05) m/s, σ 10 m and 5 mm/s, e_n 0.5, e_t 0.8, seed 7)
 * with N samples on all threads, hierarchical field 1e-6, integrator 1e-8: the strict path
 * ({@link Propagator#withStrict}, the code before the field continuation — the baseline) and the default path side
 * by side in the same run, wall and process CPU time, and how far the rest points of the two runs differ.
 */
final class MotionBench {
    /** Field tolerance and integrator tolerance of the deployment bench (the defaults of {@code cairn deploy}). */
    static final double FIELD_TOLERANCE = DeployCommand.DEFAULT_FIELD_TOLERANCE;
    static final double INTEGRATOR_TOLERANCE = DeployCommand.DEFAULT_INTEGRATOR_TOLERANCE;

    private MotionBench() {
    }

    static void run(PrintWriter out, BodyModel body, int samples, int threads) {
        body.requireFitForGravity();
        PolyhedronField exact = body.polyhedronField();
        out.printf(Locale.ROOT, "Motion bench: %s, %d facets, GM %.6g m^3/s^2, spin period %.6g s, %d threads, "
                + "load average %.2f%n", body.name(), body.mesh().facetCount(), body.gm(), body.spin().periodSeconds(),
            threads, loadAverage());
        long b0 = System.nanoTime();
        HierarchicalField fast = new HierarchicalField(body.mesh(), exact, FIELD_TOLERANCE, threads);
        out.printf(Locale.ROOT, "  hierarchical field (tolerance %.0e) built in %.1f s%n", FIELD_TOLERANCE,
            (System.nanoTime() - b0) / 1e9);
        b0 = System.nanoTime();
        double[] c = body.massProperties().centerOfMass();
        double[] axis = body.spin().axis();
        BoxGrid grid = BoxGrid.ofSpacing(new double[] {-1500, 1500, -800, 800, -700, 700}, new double[] {50, 50, 50});
        TableLayout layout = new TableLayout(grid, true, false, false, 0, axis, c);
        TableField table = new TableField(TableBuilder.compute(fast, layout, threads, Map.of()), fast);
        out.printf(Locale.ROOT, "  table (50 m box grid with gradients, %d nodes, from the hierarchical field) built in "
            + "%.1f s%n", grid.nodeCount(), (System.nanoTime() - b0) / 1e9);

        out.println("Trajectories: 4 states, 1 d each, body frame, integrator 1e-10, 1 thread");
        double[][] states = {{3000, 0, 0, 0, 0.268, 0}, {0, 0, 1200, 0.05, 0, -0.1}, {2000, 500, 300, -0.1, 0.2, 0.05},
            {0, 1500, 0, 0.3, 0, 0}};
        MotionSettings ms = MotionSettings.defaults(Frame.BODY).withTolerances(1e-10, 1e-10);
        String[] names = {"exact direct sum", "hierarchical " + String.format(Locale.ROOT, "%.0e", FIELD_TOLERANCE),
            "table (tricubic)"};
        FieldModel[] fields = {exact, fast, table};
        for (int k = 0; k < fields.length; k++) {
            Propagator p = TrajectoryCommand.propagator(body, fields[k], ms);
            p.propagate(states[1], 600, 600); // warm-up
            long steps = 0;
            long evals = 0;
            long t0 = System.nanoTime();
            for (double[] s : states) {
                Trajectory t = p.propagate(s, 86400, 86400);
                steps += t.steps();
                evals += t.fieldEvaluations();
            }
            double sec = (System.nanoTime() - t0) / 1e9;
            out.printf(Locale.ROOT, "  %-22s %6d steps in %7.2f s = %7.0f steps/s, %6.0f field evaluations per "
                + "trajectory, %8.0f evaluations/s%n", names[k], steps, sec, steps / sec, evals / 4.0, evals / sec);
        }

        out.printf(Locale.ROOT, "Deployment: %d samples, demo release, hierarchical %.0e, integrator %.0e, %d threads "
            + "(baseline = strict path, same field and tolerances)%n", samples, FIELD_TOLERANCE, INTEGRATOR_TOLERANCE,
            threads);
        DeploymentSettings ds = new DeploymentSettings(new double[] {0, 0, 750}, new double[] {0.02, 0, -0.05},
            samples, 10, 0.005, 0.5, 0.8, 7, 1e-3, 0.01, 3 * 86400, 1000);
        MotionSettings dm = MotionSettings.defaults(Frame.BODY).withTolerances(INTEGRATOR_TOLERANCE,
            INTEGRATOR_TOLERANCE);
        Propagator p = TrajectoryCommand.propagator(body, fast, dm);
        List<Landing> base = deploy(out, "baseline (strict path)", p.withStrict(true), ds, threads);
        List<Landing> now = deploy(out, "default path", p, ds, threads);
        double[] d = new double[samples];
        int bounceDiff = 0;
        for (int i = 0; i < samples; i++) {
            double[] a = base.get(i).position();
            double[] b = now.get(i).position();
            d[i] = Math.sqrt((a[0] - b[0]) * (a[0] - b[0]) + (a[1] - b[1]) * (a[1] - b[1])
                + (a[2] - b[2]) * (a[2] - b[2]));
            if (base.get(i).bounces() != now.get(i).bounces() || base.get(i).outcome() != now.get(i).outcome()) {
                bounceDiff++;
            }
        }
        Arrays.sort(d);
        out.printf(Locale.ROOT, "  rest points, default against baseline: median %.2e m, 90%% within %.2e m, max %.2e m;"
            + " %d of %d outcomes or bounce counts differ%n", d[samples / 2], d[(int) (0.9 * (samples - 1))],
            d[samples - 1], bounceDiff, samples);
        out.printf(Locale.ROOT, "  load average at the end %.2f%n", loadAverage());
    }

    private static List<Landing> deploy(PrintWriter out, String label, Propagator p, DeploymentSettings ds,
                                        int threads) {
        double cpu0 = processCpuSeconds();
        long t0 = System.nanoTime();
        List<Landing> ls = Deployment.run(p, ds, threads, ProgressListener.NONE);
        double sec = (System.nanoTime() - t0) / 1e9;
        double cpu = processCpuSeconds() - cpu0;
        long steps = 0;
        long evals = 0;
        int rest = 0;
        for (Landing l : ls) {
            steps += l.steps();
            evals += l.fieldEvaluations();
            rest += l.outcome() == Landing.Outcome.REST ? 1 : 0;
        }
        out.printf(Locale.ROOT, "  %-24s %7.1f s wall, %7.1f s CPU, %7d steps, %6.0f field evaluations per sample, "
            + "%d at rest%n", label, sec, cpu, steps, (double) evals / ls.size(), rest);
        out.flush();
        return ls;
    }

    private static double loadAverage() {
        return ManagementFactory.getOperatingSystemMXBean().getSystemLoadAverage();
    }

    /** CPU time of the whole process, s (NaN when the platform does not tell). */
    private static double processCpuSeconds() {
        if (ManagementFactory.getOperatingSystemMXBean() instanceof com.sun.management.OperatingSystemMXBean os) {
            return os.getProcessCpuTime() / 1e9;
        }
        return Double.NaN;
    }
}
