namespace LaunchLogger.Decoding.Reconstruction;

/// <summary>Knobs of the reconstruction. The defaults suit the box and typical cars; every
/// property says its unit.</summary>
public sealed record ReconstructionOptions
{
    /// <summary>The defaults.</summary>
    public static ReconstructionOptions Default { get; } = new();

    /// <summary>Rollout distance, metres; null for the run's configured one.</summary>
    public double? RolloutM { get; init; }

    /// <summary>Use the accelerometer when the run has one.</summary>
    public bool UseAccelerometer { get; init; } = true;

    /// <summary>Use the pulses when the run has them.</summary>
    public bool UsePulses { get; init; } = true;

    /// <summary>How long before first motion the trajectory starts, seconds.</summary>
    public double PreRollS { get; init; } = 0.1;

    /// <summary>Step of the trajectory's time grid, seconds. With an accelerometer the grid falls
    /// on every n-th sample (n ≈ step × rate); the acceleration between grid points is integrated
    /// exactly, so the step only sets how finely the result is reported.</summary>
    public double GridStepS { get; init; } = 0.002;

    /// <summary>The most grid points whose filtered states the smoother keeps whole (216 bytes
    /// each; the default, 262,144, is about 9 minutes at 2 ms). A longer run keeps every 1024th
    /// filter state and replays the rest as the backward pass needs them: the same result for
    /// about a third more time, in memory that no longer grows with the run. A memory knob, not
    /// a modelling choice.</summary>
    public int FilterStatesKept { get; init; } = 1 << 18;

    /// <summary>1-σ error of each edge's position around the pulse ring as a fraction of the
    /// pulse pitch (machining and sensor threshold spread; about 1 % is common practice).</summary>
    public double ToothSpacingErrorFraction { get; init; } = 0.01;

    /// <summary>True: measure the ring's tooth positions from the run's own steady revolutions
    /// and place each edge where it sits (<see cref="ToothPositions"/>); false: every edge on
    /// its even place with <see cref="ToothSpacingErrorFraction"/>.</summary>
    public bool MeasureToothPositions { get; init; } = true;

    /// <summary>A saved map of the distance channel's ring (the settings' tooth spacing), used
    /// with <see cref="MeasureToothPositions"/> when the run's steady revolutions tell how to turn
    /// it to the run (<see cref="ToothPositions"/>); null: none.</summary>
    public Calibration.ToothGaps? SavedToothGaps { get; init; }

    /// <summary>1-σ timing jitter of an edge time beyond its bracket, seconds.</summary>
    public double EdgeJitterS { get; init; } = 5e-6;

    /// <summary>Accelerometer noise per sample, m/s²; null to measure it from the resting samples.</summary>
    public double? AccelNoiseMps2 { get; init; }

    /// <summary>How fast the accelerometer's error (bias, body pitch, scale) may wander, as the
    /// spectral density of its random walk, m²/s⁵.</summary>
    public double BiasWanderDensity { get; init; } = 0.05;

    /// <summary>The same without pulses, m²/s⁵: nothing then tells a wandering bias from motion,
    /// so it is taken as steadier (a sensor's offset drifts over minutes, not seconds).</summary>
    public double AccelOnlyBiasWanderDensity { get; init; } = 0.002;

    /// <summary>1-σ scale error of the accelerometer's forward axis, as a fraction (about 1 % for
    /// consumer MEMS parts; common practice). Without pulses it widens σ of speed and distance in
    /// proportion to them.</summary>
    public double AccelScaleSigma { get; init; } = 0.01;

    /// <summary>The forward axis' measured scale factor (reads this many times the true specific
    /// force) with its 1 σ, from <c>launchlogger calibrate accelerometer</c>; null when not
    /// calibrated. When given, the forward input is divided by it, its σ takes the place of
    /// <see cref="AccelScaleSigma"/>, and a standing start with pulses measures the pulses' own
    /// scale against it (<see cref="RollingScaleFit"/>). Null leaves everything as it was.</summary>
    public Estimate? AccelScaleCalibration { get; init; }

    /// <summary>How fast the accelerometer's error may wander over the launch in the rolling-scale
    /// fit, m²/s⁵: what the pitch compensation and the resting level leave (a body pitch half
    /// compensated, cross-axis pick-up), far steadier than the filter's
    /// <see cref="BiasWanderDensity"/>, which also stands for an uncalibrated scale error.
    /// 1e-4 lets the error drift by 0.017 m/s² (1σ) over 3 s (ours).</summary>
    public double RollingScaleBiasWanderDensity { get; init; } = 1e-4;

    /// <summary>The longest launch the rolling-scale fit reads, seconds after first motion.</summary>
    public double RollingScaleWindowS { get; init; } = 6;

    /// <summary>The longest record that opens moving the rolling-scale fit reads, seconds after
    /// its first pulse: a rolling start or a stop from cruise, down to the rest it ends in.</summary>
    public double RollingScaleMovingWindowS { get; init; } = 40;

    /// <summary>The fit reads the launch only up to this speed, m/s, where the tyre's growth is
    /// still small (a quarter of its growth at 30 m/s at 15 m/s).</summary>
    public double RollingScaleTopSpeedMps { get; init; } = 20;

    /// <summary>The scale error of the forward axis in force: the calibration's σ when calibrated,
    /// else <see cref="AccelScaleSigma"/>.</summary>
    internal double ForwardScaleSigma => AccelScaleCalibration?.Sigma ?? AccelScaleSigma;

    /// <summary>Extra white acceleration noise the accelerometer model allows (vibration, cross
    /// axis), spectral density m²/s³.</summary>
    public double AccelModelNoiseDensity { get; init; } = 2e-4;

    /// <summary>Spectral density of the jerk the pulses-only model allows, m²/s⁵.</summary>
    public double JerkDensity { get; init; } = 200;

    /// <summary>1-σ of the accelerometer bias left after removing the resting level, m/s² (sensor
    /// drift since staging).</summary>
    public double BiasPriorMps2 { get; init; } = 0.02;

    /// <summary>Look for wheelspin (pulses ahead of the accelerometer) and stop trusting the
    /// pulses there.</summary>
    public bool DetectWheelspin { get; init; } = true;

    /// <summary>The smallest excess of pulse speed over accelerometer speed that counts as
    /// wheelspin, m/s; it also has to pass <see cref="WheelspinFraction"/> of the speed.</summary>
    public double WheelspinMinExcessMps { get; init; } = 0.25;

    /// <summary>The smallest excess that counts as wheelspin, as a fraction of the speed.</summary>
    public double WheelspinFraction { get; init; } = 0.04;

    /// <summary>The largest slip ratio a clean launch's driven tyre shows, at the peak of its
    /// force–slip curve (about 0.1–0.2 on dry roads: J. Y. Wong, "Theory of Ground Vehicles",
    /// ch. 1; H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1; from memory): near standstill the
    /// pulses counting more than the accelerometer's distance by this share, beyond their σ, is
    /// spin (<see cref="WheelspinDetector.FindAtLaunch"/>).</summary>
    public double LaunchSpinSlip { get; init; } = 0.2;

    /// <summary>The most grip a tyre gives on the road or track, as a friction coefficient μ:
    /// about 0.8–1.0 for road tyres on dry asphalt (J. Y. Wong, "Theory of Ground Vehicles", ch. 1;
    /// from memory) and up to about 1.3 for track tyres (from memory); 1.5 leaves room above both.
    /// With pulses alone, a wheel gaining speed faster than (1 + <see cref="LaunchSpinSlip"/>)·μ·g
    /// allows is spin (<see cref="PulseSpinBound"/>). Drag slicks on a prepared strip grip more:
    /// raise it for them.</summary>
    public double LargestGripMu { get; init; } = 1.5;

    /// <summary>Take the body's pitch under acceleration and braking out of the forward axis,
    /// using the vertical axis, when all three axes were measured.</summary>
    public bool CompensateBodyPitch { get; init; } = true;

    /// <summary>Prior σ of the pickup wheel's slip per m/s² of drive, s²/m (0 to leave tyre slip
    /// out). A driven wheel slips about 1–3 % under hard acceleration; 0.005 allows 2.5 % at
    /// 5 m/s².</summary>
    public double WheelSlipSigma { get; init; } = 0.005;

    /// <summary>The pickup tyre's slip stiffness under braking: with an accelerometer and pulses
    /// the fusion estimates the wheel's brake slip per unit of deceleration, 1/(g0·C), from this
    /// prior (<see cref="FusionSettings.BrakeSlipSignal"/>); <see cref="Braking.BrakeSlipPrior.None"/>
    /// leaves it out. The analysis sets it from <see cref="Analysis.AnalysisOptions.BrakeSlip"/>.</summary>
    public Braking.BrakeSlipPrior BrakeSlip { get; init; } = Braking.BrakeSlipPrior.CarTyres;

    /// <summary>1-σ relative error of distance from the pulses that no sensor here can see, as a
    /// fraction: an undriven tyre slips by about (rolling resistance + the force that spins the
    /// wheel up) ÷ slip stiffness, a few 10⁻⁴ in a hard launch (slip stiffness 20–30 per unit of
    /// load; H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1). It widens σ of distance and
    /// speed in proportion to them.</summary>
    public double PulseScaleSigma { get; init; } = 3e-4;

    /// <summary>1-σ relative error of the circumference the pulses are scaled by, as a fraction.
    /// Uncalibrated, the box holds a static or tyre-size figure, and a loaded tyre rolls on a
    /// circumference 0–2 % smaller (from memory): 1 % puts that range inside 2 σ. A calibration's
    /// own σ replaces it (<see cref="Analysis.RunAnalyzer"/> does so from the settings file).</summary>
    public double CircumferenceSigmaFraction { get; init; } = 0.01;

    /// <summary>The rolling circumference the pulses are scaled by, over the one the run's
    /// configuration holds: 1 when that is the rolling one or nothing is known of it;
    /// <see cref="Calibration.TyrePrior.RollingOverStatic"/> when the settings say it is the
    /// tyre's static (unloaded) circumference (<see cref="Calibration.CalibrationSettings.StaticCircumferenceM"/>).
    /// <see cref="CircumferenceSigmaFraction"/> is the σ around it.</summary>
    public double RollingOverToldCircumference { get; init; } = 1;

    /// <summary>The tyre's growth of rolling radius at 30 m/s taken as known, as a fraction
    /// (growing with the square of speed); <see cref="TyreGrowthSigmaAt30Mps"/> is the σ around
    /// it. 0 unless the settings give a static circumference, which comes with the typical growth
    /// (<see cref="Calibration.TyrePrior.GrowthAt30Mps"/>).</summary>
    public double TyreGrowthAt30Mps { get; init; }

    /// <summary>1-σ of the tyre's growth of rolling radius at 30 m/s, as a fraction, for a tyre not
    /// calibrated at speed; it scales with the square of speed (the tread's centrifugal growth).
    /// Car tyres grow by some 0.1–0.5 % at 30 m/s (from memory), so 0.3 % puts the largest of them
    /// inside 2 σ. 0 once the circumference has been calibrated at the speeds that matter.</summary>
    public double TyreGrowthSigmaAt30Mps { get; init; } = 0.003;

    /// <summary>1-σ rate error of the box's clock, as a fraction (a crystal without temperature
    /// control: about 30 ppm, from memory). Every time the box measures stretches by it.</summary>
    public double TimebaseSigma { get; init; } = 30e-6;

    /// <summary>1-σ rate error of an accelerometer's own clock against the box's, as a fraction,
    /// for sample times read from a plain-text file: nothing there ties them to the pulses' clock,
    /// and two crystal clocks differ by up to about 100 ppm (from memory), σ 58 ppm for a spread
    /// uniform over ±100 ppm. Over a long wait at rest before the launch that slides the
    /// accelerometer's onset against the pulses by milliseconds (6 ms after 60 s at 100 ppm).</summary>
    public double TextAccelClockRateSigma { get; init; } = 58e-6;

    /// <summary>1-σ of a driven wheel's slip at the launch, as a fraction of the distance, for runs
    /// with pulses only (nothing then shows whether the wheel is driven): a driven tyre launching
    /// near its grip limit slips by 5–15 % (the peak of its force–slip curve; H. B. Pacejka, "Tire
    /// and Vehicle Dynamics", ch. 1, figures from memory), fading as the speed builds
    /// (<see cref="LaunchSlipFadeM"/>). With an accelerometer the slip is measured instead
    /// (<see cref="LaunchSlipAllowance"/>).</summary>
    public double PulsesOnlyLaunchSlip { get; init; } = 0.05;

    /// <summary>Distance over which a launch slip fades, m (ours: the first couple of feet).</summary>
    public double LaunchSlipFadeM { get; init; } = 0.5;

    /// <summary>Which wheel carries the pickup, when told (<see cref="Reconstruction.PickupWheel"/>);
    /// <see cref="PickupWheel.NotSaid"/> keeps <see cref="PulsesOnlyLaunchSlip"/> about an unmoved
    /// estimate. Used only with pulses alone: the launch slip on a standing start, the drive slip
    /// (<see cref="DrivenSlip"/>) on it and on a record that opens moving.</summary>
    public PickupWheel PickupWheel { get; init; } = PickupWheel.NotSaid;

    /// <summary>Expected launch slip of a wheel told to be driven, as a fraction of the distance
    /// (fading over <see cref="LaunchSlipFadeM"/>), with pulses only: the slip is one-signed (the
    /// wheel is ahead), so the distance is moved back by it. A driven tyre launching near its grip
    /// limit works near the peak of its longitudinal force–slip curve, which on a dry road lies at
    /// a slip ratio of about 0.1–0.15 (H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1, the
    /// longitudinal characteristic; T. D. Gillespie, "Fundamentals of Vehicle Dynamics", ch. 2,
    /// tractive coefficient against slip; both figures from memory); a launch held a little short
    /// of the peak slips less. 10 %, with <see cref="DrivenLaunchSlipSigma"/>, spans 5–15 % at ±2σ
    /// (the range <see cref="PulsesOnlyLaunchSlip"/> names).</summary>
    public double DrivenLaunchSlip { get; init; } = 0.10;

    /// <summary>1-σ of <see cref="DrivenLaunchSlip"/>, a fraction: what is not known about the
    /// slip's size on a wheel told to be driven (5–15 % at ±2σ).</summary>
    public double DrivenLaunchSlipSigma { get; init; } = 0.025;

    /// <summary>What is known of a driven pickup tyre's slip under drive past the launch, on a wheel
    /// told to be one of the car's one driven pair with pulses only (<see cref="PickupWheel.Driven"/>):
    /// the wheel turns faster than the road by slip = (its drive force ÷ its load) ÷ C, the linear
    /// part of its force–slip curve (H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1), the same law
    /// and the same car tyres' C of 15–30 per unit slip as under braking
    /// (<see cref="Braking.BrakeSlipPrior.CarTyres"/>; from memory). The share, the wheel's drive
    /// force over its load as a multiple of the car's drive per unit mass over g0, is 1 / w for a
    /// wheel of the driven pair whose axle carries the share w of the car's weight while it
    /// accelerates, w = ψ − χ·a/g0 at the front and 1 − ψ + χ·a/g0 at the rear (static front weight
    /// ψ, centre-of-mass height over wheelbase χ; T. D. Gillespie, "Fundamentals of Vehicle
    /// Dynamics", ch. 2): for road cars (from memory: ψ 0.58–0.65 with the front axle driven,
    /// 0.45–0.55 with the rear, χ 0.15–0.25, a 0.2–0.6 g) w is 0.43–0.70, a share of 1.4–2.3. The
    /// slip per m/s² of drive, share/(C·g0), is then 0.0087 ± 0.0022 s²/m
    /// (<see cref="Braking.BrakeSlipPrior.MeanWheelSlip"/>, <see cref="Braking.BrakeSlipPrior.WheelSlipSigma"/>
    /// over g0): 1.3–3.1 % at 3 m/s².</summary>
    public Braking.BrakeSlipPrior DrivenSlip { get; init; } = new(15, 30, 1.4, 2.3);

    /// <summary>The same for a wheel of a car whose four wheels are all driven
    /// (<see cref="PickupWheel.DrivenAllWheels"/>): the drive split between the axles near their
    /// loads (a fixed split of 0.35–0.5 to the front against a front load of 0.42–0.55 while the
    /// car accelerates; from memory), each wheel works at 0.8–1.2 of the car's drive over its
    /// load: 0.0047 ± 0.0011 s²/m.</summary>
    public Braking.BrakeSlipPrior AllWheelsDrivenSlip { get; init; } = new(15, 30, 0.8, 1.2);

    /// <summary>Share of a driven wheel's estimated slip correction taken as 1-σ model error: the
    /// slip law is linear, and real tyres slip more near their grip limit, as in a hard launch
    /// (sized on simulated launches so that the rollout mark stays within ±2 σ).</summary>
    public double SlipModelError { get; init; } = 0.6;

    /// <summary>Slip coefficients below this count as no slip (an undriven wheel), s²/m: 0.001
    /// is 0.5 % of slip at 5 m/s² of drive.</summary>
    public double WheelSlipMinimum { get; init; } = 0.001;

    /// <summary>An undriven pickup wheel's slip per m/s² of drive, s²/m: the centre of the prior
    /// a slip coefficient not kept (<see cref="WheelSlipMinimum"/>) is conditioned on, in place of
    /// no slip. Only its tyre turns an undriven wheel, so spinning it up at α = a / r takes a
    /// force I·a / r² at the contact, which the tyre passes at a slip of that force ÷ (C·N) (the
    /// linear part of the force–slip curve; H. B. Pacejka, "Tire and Vehicle Dynamics", ch. 1):
    /// the wheel turns less than the car moves, k = −I / (r²·N·C). With I = 1.0 kg·m² (wheel, tyre,
    /// brake disc and hub of a road car; from memory), r = 0.31 m (a road tyre's rolling radius;
    /// common practice), N = 3.7 kN (a quarter of a 1,500 kg car; common practice) and C = 22 per
    /// unit slip (passenger tyres; from memory): −1.28·10⁻⁴, 0.1 % at 8 m/s². 0 (with
    /// <see cref="UndrivenSlipSigma"/> 0) conditions on no slip.</summary>
    public double UndrivenSlipPerMps2 { get; init; } = -1.28e-4;

    /// <summary>1-σ of <see cref="UndrivenSlipPerMps2"/>, s²/m: I ± 0.25 kg·m², r ± 0.02 m,
    /// N ± 0.8 kN (1,000–2,000 kg cars, the load moving under drive) and C ± 5 (from memory), to
    /// first order a relative √(0.25² + (2·0.065)² + 0.22² + 0.23²) = 42 % of the centre.</summary>
    public double UndrivenSlipSigma { get; init; } = 0.54e-4;

    /// <summary>With two pulse channels, measure distance on the one that turns less under drive
    /// (the undriven wheel).</summary>
    public bool UseSecondChannel { get; init; } = true;

    /// <summary>Air drag per unit mass per speed squared, 1/m, used to turn acceleration into
    /// drive force for the slip model: ½·ρ·Cd·A/m, about 3.4·10⁻⁴ for a 1200-kg car with
    /// Cd·A = 0.66 m² in air of 1.225 kg/m³ (common practice).</summary>
    public double DragPerMassPerSpeedSquared { get; init; } = 3.4e-4;

    /// <summary>Rolling resistance coefficient for the same purpose (about 0.012 for car tyres on
    /// asphalt; common practice).</summary>
    public double RollingResistance { get; init; } = 0.012;

    /// <summary>Bracket width above which an observation counts as wide, seconds; null for the
    /// run's configured limit (2 ms when it has none).</summary>
    public double? WideBracketS { get; init; }

    /// <summary>Braking force per unit mass (measured deceleration less typical drag and rolling
    /// resistance) above which the pulses are set aside, m/s²: a braked tyre turns slower than
    /// the car moves, by its braking slip (under ABS 5–20 %; H. B. Pacejka, "Tire and Vehicle
    /// Dynamics", ch. 1), so there the accelerometer carries distance and speed. 0 keeps the pulses.</summary>
    public double BrakingDecelMps2 { get; init; } = 1.5;

    /// <summary>1-σ of the accelerometer's error changing when braking starts beyond its scale
    /// error (body pitch left after compensation, cross-axis), m/s².</summary>
    public double BrakeBiasStepSigmaMps2 { get; init; } = 0.05;

    /// <summary>How fast the accelerometer's error may wander while braking without pulses,
    /// m²/s⁵ (as <see cref="AccelOnlyBiasWanderDensity"/>: nothing else tells it from motion).</summary>
    public double BrakeBiasWanderDensity { get; init; } = 0.002;

    /// <summary>How fast the accelerometer's error may wander under firm braking where the pulses
    /// are kept and the braked tyre's slip is fitted, m²/s⁵. There the accelerometer's scale error
    /// is a state of its own (its part of the error grows with the deceleration, as a body's dive
    /// does), so the wander is only what the pitch compensation and the resting level leave, as
    /// in the rolling-scale fit (<see cref="RollingScaleBiasWanderDensity"/>): 1e-4 lets it drift
    /// by 0.02 m/s² (1σ) over a 4-s stop. A wander as free as <see cref="BrakeBiasWanderDensity"/>
    /// (0.045 m/s² a second) takes up, on a noisy accelerometer, part of what the slip leaves in
    /// the pulses (a 1.9-s rise to 0.78 g from 72 mph at 200 Hz: the slip 14 % low).</summary>
    public double FirmBrakeBiasWanderDensity { get; init; } = 1e-4;

    /// <summary>Acceleration-only runs: the run counts as stopped when the last this many seconds
    /// of samples rest at the resting level, seconds.</summary>
    public double StillAtEndS { get; init; } = 1.0;
}
