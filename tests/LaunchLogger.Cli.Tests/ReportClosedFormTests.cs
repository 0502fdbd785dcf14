using System.Globalization;
using System.Text;
using System.Text.Json;
using LaunchLogger.Cli.Verbs;
using LaunchLogger.Decoding.Braking;

namespace LaunchLogger.Cli.Tests;

/// <summary>End to end through <c>report --json</c> on plain-text inputs written from closed forms:
/// the truth comes from kinematics, not from the simulator or the figure code.</summary>
/// <remarks>
/// The run (kinematics, any textbook, per phase): still until 2 s; 0.5 g0 to 430 m (past the
/// quarter mile); 1 s coasting; the brakes build linearly to 8 m/s² over 0.2 s and hold it down to
/// half the braking speed, then 9 m/s² to standstill. Edges every 0.02 m, accelerometer at 1 kHz.
/// Measured errors of the whole method on this input (2026-12): first motion −0.4 ms, 0–60 mph
/// +0.34 ms, quarter mile +0.32 ms (after rollout under 0.01 ms), trap speed +0.014 %, brake onset
/// under 1 µs, stopping distance −0.2 mm, MFDD under 10⁻⁶ m/s². Tolerances are a few times those.
/// </remarks>
public class ReportClosedFormTests
{
    private const double G0 = 9.80665; // standard gravity (3rd CGPM, 1901; ISO 80000-3)
    private const double A = 0.5 * G0;
    private const double T0 = 2.0;
    private const double LaunchEndM = 430;
    private const double CoastS = 1.0;
    private const double RampS = 0.2;
    private const double FirstDecel = 8.0;
    private const double SecondDecel = 9.0;
    private const double MetresPerPulse = 0.02;
    private const double Foot = 0.3048; // exact (international yard and pound agreement, 1959)
    private const double QuarterAfterRolloutS = 0.001; // see the quarter mile's check

    private static readonly Lazy<(string Edges, string Accel)> Inputs = new(WriteInputs);

    private static double LaunchEndS => T0 + Math.Sqrt(2 * LaunchEndM / A);

    private static double BrakeSpeedMps => A * (LaunchEndS - T0);

    private static double BrakeOnsetS => LaunchEndS + CoastS;

    [Fact]
    public void QuarterMileTrapSpeedAndZeroToSixtyMatchTheClosedForm()
    {
        JsonElement run = Report(weather: null).RootElement.GetProperty("runs")[0];

        // Kinematics from rest at a: t(d) = √(2d/a), v(t) = a·t. REFERENCES (0.5 g): 1 ft in
        // 0.35260 s, 0–60 mph in 5.4702 s, 5.1177 s after the first foot.
        double rollout = TimeToDistance(Foot);
        double zeroTo60 = (60 * 0.44704) / A;
        Assert.InRange(rollout, 0.35259, 0.35261);
        Assert.InRange(zeroTo60, 5.47015, 5.47025);
        Near(T0, run.GetProperty("first_motion_s").GetDouble(), 0.0015, "first motion");
        JsonElement sixty = Interval(run, "0-60 mph");
        Near(zeroTo60, sixty.GetProperty("from_standstill_s").GetDouble(), 0.0015, "0-60 mph from standstill");
        Near(zeroTo60 - rollout, sixty.GetProperty("from_rollout_s").GetDouble(), 0.0005, "0-60 mph after rollout");
        Near(rollout, run.GetProperty("rollout").GetProperty("after_first_motion_s").GetDouble(), 0.0015, "rollout time");
        // Speed at 1 ft: v = √(2·a·d) = 1.72885 m/s.
        Near(Math.Sqrt(2 * A * Foot), run.GetProperty("rollout").GetProperty("speed_mps").GetDouble(), 0.005, "rollout speed");

        // Quarter mile = 1320 ft; trap = the 66 ft before it (common practice; REFERENCES).
        double quarterM = 1320 * Foot;
        double quarter = TimeToDistance(quarterM);
        double trap = (66 * Foot) / (quarter - TimeToDistance(1254 * Foot));
        JsonElement mark = Mark(run, "1320 ft (1/4 mile)");
        Near(quarter, mark.GetProperty("from_standstill_s").GetDouble(), 0.0015, "quarter mile from standstill");
        // The step falls on a sample (the first to read it is at T0), so the accelerometer can
        // place it only within the millisecond before: the gap's middle, 0.5 ms early. The slip the
        // undriven wheel is given against the accelerometer carries that into the quarter mile after
        // rollout about one for one (measured: 0.14 ms for an onset moved 0.12 ms), hence 1 ms here.
        Near(quarter - rollout, mark.GetProperty("from_rollout_s").GetDouble(), QuarterAfterRolloutS, "quarter mile after rollout");
        Near(trap, mark.GetProperty("trap_speed_mps").GetDouble(), 0.0005 * trap, "quarter-mile trap speed");
        Near(A * quarter, mark.GetProperty("speed_mps").GetDouble(), 0.0005 * A * quarter, "speed at the quarter mile");
    }

    [Fact]
    public void StoppingDistanceAndMfddMatchTheClosedForm()
    {
        JsonElement braking = Report(weather: null).RootElement.GetProperty("runs")[0].GetProperty("braking");

        // Stopping distance from the start of brake application (SAE J299) to standstill, per
        // phase: ramp v·τ − b·τ²/6, then (v_r² − v_h²)/(2·8), then v_h²/(2·9).
        double v = BrakeSpeedMps;
        double vr = v - (FirstDecel * RampS / 2);
        double vh = v / 2;
        double distance = (v * RampS) - (FirstDecel * RampS * RampS / 6) + (((vr * vr) - (vh * vh)) / (2 * FirstDecel)) + (vh * vh / (2 * SecondDecel));
        Assert.Equal("deceleration onset", braking.GetProperty("onset_method").GetString());
        Near(BrakeOnsetS, braking.GetProperty("onset_s").GetDouble(), 0.001, "brake onset");
        // The wheel's slip under the launch is not told (the decoder's prior on it has σ
        // 0.54·10⁻⁴ s²/m, UndrivenSlipPerMps2): its 1σ at the launch's end is σ·a·v = 0.017 m/s.
        Near(v, braking.GetProperty("from_mps").GetDouble(), 0.02, "speed at brake onset");
        Near(distance, braking.GetProperty("stopping_distance_m").GetDouble(), 0.01, "stopping distance");

        // MFDD, UN Regulation No. 13-H Annex 3: v_b = 0.8·v0, v_e = 0.1·v0, both inside the
        // constant phases; by hand with V = v0²: s_e − s_b = (0.64 − 0.25)·V/16 + (0.25 − 0.01)·V/18,
        // d_m = 0.63·V / (2·(s_e − s_b)) = 0.63 / (2 × 0.0377083) = 8.35359 m/s². The windows
        // 0.9–0.1 and 0.8–0.2 would give 8.2759 and 8.3237.
        Near(8.35359, braking.GetProperty("mfdd_mps2").GetDouble(), 0.005, "MFDD");
    }

    [Fact]
    public void WeatherOutputsMatchIndependentDerivations()
    {
        JsonElement root = Report(weather: "20,1008,62").RootElement;
        JsonElement weather = root.GetProperty("weather");
        const double TemperatureC = 20, PressureKPa = 100.8, Humidity = 0.62;

        // Saturation vapour pressure of water at 20 °C: 2.3388 kPa (CRC Handbook of Chemistry and
        // Physics, 73rd ed. 1992–93, "Vapor pressure of water from 0 to 370 °C").
        double vapourKPa = Humidity * 2.3388;
        double dryKPa = PressureKPa - vapourKPa;

        // SAE J1349 (JUN1990 form) derived from its model rather than its formula: indicated power
        // scales with dry-air pressure and with 1/√T (flow through the intake); friction power is
        // the same at both conditions; mechanical efficiency at the test is 1/1.18 (≈ 85 %).
        // Corrected brake power / measured brake power is the factor.
        double measuredBrake = 100;
        double indicated = measuredBrake * 1.18;
        double friction = indicated - measuredBrake;
        double indicatedAtStandard = indicated * (99 / dryKPa) * Math.Sqrt((TemperatureC + 273) / 298);
        double factor = (indicatedAtStandard - friction) / measuredBrake;
        Near(factor, weather.GetProperty("correction_factor").GetDouble(), 5e-5, "SAE J1349 factor");

        // Moist-air density by virtual temperature (meteorology texts, e.g. Wallace & Hobbs,
        // Atmospheric Science, §3.1.1): ρ = p / (R_d·T_v), T_v = T / (1 − (e/p)·(1 − ε)), with
        // ε = M_w/M_d = 18.01528/28.96546 and R_d = R/M_d = 8.314462618/0.02896546 (CODATA R;
        // molar masses as in the CIPM-2007 air density equation, from memory).
        double epsilon = 18.01528 / 28.96546;
        double rd = 8.314462618 / 0.02896546;
        double temperatureK = TemperatureC + 273.15;
        double virtualK = temperatureK / (1 - (vapourKPa / PressureKPa * (1 - epsilon)));
        double density = PressureKPa * 1000 / (rd * virtualK);
        Near(density, weather.GetProperty("density_kg_per_m3").GetDouble(), 2e-4, "air density");

        // Density altitude: the ISA troposphere from its defining constants (US Standard
        // Atmosphere 1976: T0 = 288.15 K, L = 6.5 K/km, g0, M0 = 28.9644 kg/kmol,
        // R* = 8.31432 J/(mol·K), ρ0 = 1.225 kg/m³): ρ(h) = ρ0·(1 − L·h/T0)^(g0·M0/(R*·L) − 1).
        // At the reported altitude that must give back the reported density.
        double altitude = weather.GetProperty("density_altitude_m").GetDouble();
        double exponent = (G0 * 0.0289644 / (8.31432 * 0.0065)) - 1;
        double isaDensity = 1.225 * Math.Pow(1 - (0.0065 * altitude / 288.15), exponent);
        Near(weather.GetProperty("density_kg_per_m3").GetDouble(), isaDensity, 1e-5, "density altitude");

        // Constant power (½·m·v² = P·t): at CF·P a speed is reached in t/CF and a distance in
        // t·CF^(−1/3). After rollout, 0–60 mph is t(60 mph) − t(1 ft), each part corrected by its
        // own exponent.
        double cf = weather.GetProperty("correction_factor").GetDouble();
        JsonElement corrected = root.GetProperty("runs")[0].GetProperty("corrections").EnumerateArray().Single(c => c.GetProperty("kind").GetString() == "standard_air");
        double zeroTo60 = (60 * 0.44704) / A;
        double rollout = TimeToDistance(Foot);
        double quarter = TimeToDistance(1320 * Foot);
        JsonElement sixty = Interval(corrected, "0-60 mph");
        Near(zeroTo60 / cf, sixty.GetProperty("from_standstill_s").GetDouble(), 0.0015, "corrected 0-60 mph");
        Near((zeroTo60 / cf) - (rollout * Math.Pow(cf, -1.0 / 3)), sixty.GetProperty("from_rollout_s").GetDouble(), 0.0005, "corrected 0-60 mph after rollout");
        JsonElement mark = Mark(corrected, "1320 ft (1/4 mile)");
        Near(quarter * Math.Pow(cf, -1.0 / 3), mark.GetProperty("from_standstill_s").GetDouble(), 0.0015, "corrected quarter mile");
        Near((quarter - rollout) * Math.Pow(cf, -1.0 / 3), mark.GetProperty("from_rollout_s").GetDouble(), QuarterAfterRolloutS, "corrected quarter mile after rollout");
        double trap = (66 * Foot) / (quarter - TimeToDistance(1254 * Foot));
        Near(trap * Math.Pow(cf, 1.0 / 3), mark.GetProperty("trap_speed_mps").GetDouble(), 0.0005 * trap, "corrected trap speed");
    }

    private static double TimeToDistance(double metres) => Math.Sqrt(2 * metres / A);

    private static void Near(double expected, double actual, double tolerance, string what) =>
        Assert.True(Math.Abs(actual - expected) <= tolerance, string.Create(CultureInfo.InvariantCulture, $"{what}: {actual:R} against {expected:R} (± {tolerance})"));

    private static JsonElement Interval(JsonElement run, string label) =>
        run.GetProperty("speed_intervals").EnumerateArray().Single(i => i.GetProperty("label").GetString() == label);

    private static JsonElement Mark(JsonElement run, string label) =>
        run.GetProperty("distance_marks").EnumerateArray().Single(m => m.GetProperty("label").GetString() == label);

    private static JsonDocument Report(string? weather)
    {
        (string edges, string accel) = Inputs.Value;
        var output = new StringWriter();
        var error = new StringWriter();
        ExitCode code = ReportCommand.Run(
            // The edges are the car's own positions: a wheel that does not slip under braking.
            new ReportRequest { Edges = new FileInfo(edges), Accel = new FileInfo(accel), MetresPerPulse = MetresPerPulse, Weather = weather, Json = true, BrakeSlip = BrakeSlipPrior.None },
            output,
            error);
        Assert.True(code == ExitCode.Ok, $"exit {code}: {error}");
        return JsonDocument.Parse(output.ToString());
    }

    /// <summary>Writes the run's edges and accelerometer samples once, to a folder removed when the test run ends.</summary>
    private static (string Edges, string Accel) WriteInputs()
    {
        string folder = Path.Combine(Path.GetTempPath(), "launchlogger-closed-form-" + Guid.NewGuid().ToString("N"));
        Directory.CreateDirectory(folder);
        AppDomain.CurrentDomain.ProcessExit += (_, _) => Directory.Delete(folder, recursive: true);
        double v = BrakeSpeedMps;
        double rampEndS = BrakeOnsetS + RampS;
        double vr = v - (FirstDecel * RampS / 2);
        double vh = v / 2;
        double brakeM = LaunchEndM + (v * CoastS);
        double rampEndM = brakeM + (v * RampS) - (FirstDecel * RampS * RampS / 6);
        double halfS = rampEndS + ((vr - vh) / FirstDecel);
        double halfM = rampEndM + (((vr * vr) - (vh * vh)) / (2 * FirstDecel));
        double stopS = halfS + (vh / SecondDecel);
        double stopM = halfM + (vh * vh / (2 * SecondDecel));
        double k = FirstDecel / RampS;

        // The pickup's wheel is undriven: only its tyre spins it up, so under the launch it turns
        // less than the road by s = I·a/(r²·N·C) (torque I·a/r for the wheel's inertia, passed by
        // a tyre of slip stiffness C under load N; H. B. Pacejka, "Tire and Vehicle Dynamics",
        // ch. 1): I 1.2 kg·m², r 0.30 m, N 4.0 kN, C 20 (a road car's; from memory), s = 0.08 %.
        // Coasting and braking it turns with the road. Edge n comes at wheel distance n·m.
        double lag = 1.2 * A / (0.30 * 0.30 * 4000 * 20);
        var edges = new StringBuilder("t_s\n");
        for (int n = 1; n * MetresPerPulse < stopM - (lag * LaunchEndM) - 1e-9; n++)
        {
            double wheel = n * MetresPerPulse;
            double road = wheel <= (1 - lag) * LaunchEndM ? wheel / (1 - lag) : wheel + (lag * LaunchEndM);
            edges.Append(TimeAt(road).ToString("R", CultureInfo.InvariantCulture)).Append('\n');
        }

        var accel = new StringBuilder("t_s,ax_mps2\n");
        for (int i = 0; i * 0.001 < stopS + 2; i++)
        {
            double t = i * 0.001;
            double a = t < T0 ? 0
                : t < LaunchEndS ? A
                : t < BrakeOnsetS ? 0
                : t < rampEndS ? -k * (t - BrakeOnsetS)
                : t < halfS ? -FirstDecel
                : t < stopS ? -SecondDecel
                : 0;
            accel.Append(string.Create(CultureInfo.InvariantCulture, $"{t:R},{a:R}\n"));
        }

        string edgesPath = Path.Combine(folder, "edges.csv");
        string accelPath = Path.Combine(folder, "accel.csv");
        File.WriteAllText(edgesPath, edges.ToString());
        File.WriteAllText(accelPath, accel.ToString());
        return (edgesPath, accelPath);

        // The time each distance is reached, inverting each phase's closed form.
        double TimeAt(double d)
        {
            if (d <= LaunchEndM)
            {
                return T0 + TimeToDistance(d);
            }

            if (d <= brakeM)
            {
                return LaunchEndS + ((d - LaunchEndM) / v);
            }

            if (d <= rampEndM)
            {
                // v·s − k·s³/6 = x, monotonic on the ramp: Newton from the coasting guess.
                double x = d - brakeM, s = x / v;
                for (int i = 0; i < 20; i++)
                {
                    s -= ((v * s) - (k * s * s * s / 6) - x) / (v - (k * s * s / 2));
                }

                return BrakeOnsetS + s;
            }

            if (d <= halfM)
            {
                return rampEndS + ((vr - Math.Sqrt((vr * vr) - (2 * FirstDecel * (d - rampEndM)))) / FirstDecel);
            }

            return halfS + ((vh - Math.Sqrt(Math.Max(0, (vh * vh) - (2 * SecondDecel * (d - halfM))))) / SecondDecel);
        }
    }
}
