package lariat.scenario;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.Iterator;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.NoSuchElementException;

/**
 * The invented demo scenario: a fleet of pumping stations, each reporting
 * {@link #channels()} and the target {@value ChannelCatalog#TARGET} once per interval of event
 * time, each with its own sparse true model of the target that changes at planned times.
 *
 * <p>Determinism: every number comes from {@link ScenarioSpec#seed()} through fixed arithmetic
 * ({@link SplitMix64}, {@link StrictMath}), so one spec gives the same rows in the same order on
 * any JVM. Station i's stream depends only on the seed and i, not on how many stations there are
 * (its change plan aside). Rows come reading by reading: all stations' reading 0, then all
 * stations' reading 1, and so on.
 */
public final class Scenario {

    private final ScenarioSpec spec;
    private final List<String> stations;
    private final List<StationProfile> profiles;
    private final long[] streamSeeds;
    private final GroundTruth truth;

    private Scenario(ScenarioSpec spec) {
        this.spec = spec;
        this.stations = StationNames.of(spec.stations());
        this.profiles = new ArrayList<>();
        this.streamSeeds = new long[spec.stations()];
        SplitMix64 master = new SplitMix64(spec.seed());
        for (int i = 0; i < spec.stations(); i++) {
            SplitMix64 station = new SplitMix64(master.nextLong());
            profiles.add(StationProfile.draw(new SplitMix64(station.nextLong())));
            streamSeeds[i] = station.nextLong();
        }
        List<StationTruth> truths = new ArrayList<>();
        for (int i = 0; i < spec.stations(); i++) {
            truths.add(truthOf(i, plannedFor(i)));
        }
        this.truth = GroundTruth.of(truths);
    }

    /**
     * @throws IllegalArgumentException if a planned change names a station beyond
     *                                  {@code spec.stations()}, falls on the first reading or
     *                                  past the last, shares a reading with another change of
     *                                  its station, adds a driving channel, or removes or flips
     *                                  one that does not drive the target
     */
    public static Scenario of(ScenarioSpec spec) {
        return new Scenario(java.util.Objects.requireNonNull(spec, "spec"));
    }

    public ScenarioSpec spec() {
        return spec;
    }

    /** Station names, in station order. */
    public List<String> stations() {
        return stations;
    }

    /** The candidate channels, in record order (the target excluded). */
    public List<String> channels() {
        return ChannelCatalog.NAMES;
    }

    /** The target channel, {@value ChannelCatalog#TARGET}. */
    public String target() {
        return ChannelCatalog.TARGET;
    }

    /** Every column of a row: the channels, then the target. */
    public List<String> columns() {
        List<String> all = new ArrayList<>(ChannelCatalog.NAMES);
        all.add(ChannelCatalog.TARGET);
        return List.copyOf(all);
    }

    public GroundTruth truth() {
        return truth;
    }

    public long totalRecords() {
        return spec.stations() * spec.recordsPerStation();
    }

    /** Event time of every station's reading {@code step}, ms since the epoch. */
    public long timeOfStep(long step) {
        return spec.start().toEpochMilli() + step * spec.interval().toMillis();
    }

    /** A fresh pass over every row, from the first; each call starts again. */
    public Iterator<StationRow> rows() {
        return new Rows();
    }

    private List<ChangeSpec> plannedFor(int station) {
        List<ChangeSpec> mine = new ArrayList<>();
        for (ChangeSpec c : spec.changes()) {
            if (c.stationIndex() >= spec.stations()) {
                throw new IllegalArgumentException("changes: station index " + c.stationIndex()
                        + " must be below stations = " + spec.stations());
            }
            if (c.stationIndex() == station) {
                mine.add(c);
            }
        }
        mine.sort(Comparator.comparingDouble(ChangeSpec::atFraction));
        return mine;
    }

    private StationTruth truthOf(int i, List<ChangeSpec> plan) {
        StationProfile profile = profiles.get(i);
        String name = stations.get(i);
        long n = spec.recordsPerStation();
        Map<String, Double> beta = profile.baseCoefficients();
        List<Regime> regimes = new ArrayList<>();
        List<InjectedChange> changes = new ArrayList<>();
        long from = 0;
        for (ChangeSpec c : plan) {
            long step = Math.round(c.atFraction() * n);
            if (step <= from || step >= n) {
                throw new IllegalArgumentException("changes: " + c + " falls on reading " + step + " of " + n
                        + " at " + name + "; it must come after reading " + from + " and before the last");
            }
            regimes.add(Regime.of(from, step, timeOfStep(from), timeOfStep(step), profile.model(beta)));
            double before = beta.getOrDefault(c.channel(), 0.0);
            beta = applied(beta, c, profile, name);
            changes.add(InjectedChange.of(name, step, timeOfStep(step), c.kind(), c.channel(), before,
                    beta.getOrDefault(c.channel(), 0.0)));
            from = step;
        }
        regimes.add(Regime.of(from, n, timeOfStep(from), timeOfStep(n), profile.model(beta)));
        return StationTruth.of(name, regimes, changes);
    }

    private static Map<String, Double> applied(Map<String, Double> beta, ChangeSpec c, StationProfile profile,
            String station) {
        Map<String, Double> next = new LinkedHashMap<>(beta);
        boolean driving = beta.containsKey(c.channel());
        if (c.kind() == ChangeKind.ENTERS) {
            if (driving) {
                throw new IllegalArgumentException("changes: " + c + " but " + c.channel()
                        + " already drives the target at " + station);
            }
            next.put(c.channel(), profile.rawCoefficient(c.channel(), c.effectPerSd()));
            return next;
        }
        if (!driving) {
            throw new IllegalArgumentException("changes: " + c + " but " + c.channel()
                    + " does not drive the target at " + station + " then (drivers: " + beta.keySet() + ")");
        }
        if (c.kind() == ChangeKind.LEAVES) {
            next.remove(c.channel());
        } else {
            next.put(c.channel(), -beta.get(c.channel()));
        }
        return next;
    }

    /** Step-major iteration over all stations. */
    private final class Rows implements Iterator<StationRow> {
        private final StationProcess[] processes = new StationProcess[stations.size()];
        private final int[] regimeIndex = new int[stations.size()];
        private final double[][] beta = new double[stations.size()][];
        private long step;
        private int station;

        Rows() {
            for (int i = 0; i < processes.length; i++) {
                processes[i] = new StationProcess(profiles.get(i), streamSeeds[i], spec.noiseSd());
                beta[i] = dense(truth.stations().get(i).regimes().get(0).model());
            }
        }

        @Override
        public boolean hasNext() {
            return step < spec.recordsPerStation();
        }

        @Override
        public StationRow next() {
            if (!hasNext()) {
                throw new NoSuchElementException("the scenario has " + totalRecords() + " rows");
            }
            List<Regime> regimes = truth.stations().get(station).regimes();
            if (!regimes.get(regimeIndex[station]).containsStep(step)) {
                regimeIndex[station]++;
                beta[station] = dense(regimes.get(regimeIndex[station]).model());
            }
            StationModel model = regimes.get(regimeIndex[station]).model();
            double[] values = new double[ChannelCatalog.count() + 1];
            long t = timeOfStep(step);
            processes[station].next(t, model.intercept(), beta[station], values);
            StationRow row = StationRow.own(stations.get(station), step, t, values, 1.0);
            if (++station == processes.length) {
                station = 0;
                step++;
            }
            return row;
        }

        private double[] dense(StationModel model) {
            double[] b = new double[ChannelCatalog.count()];
            for (Map.Entry<String, Double> e : model.coefficients().entrySet()) {
                b[ChannelCatalog.index(e.getKey())] = e.getValue();
            }
            return b;
        }
    }
}
