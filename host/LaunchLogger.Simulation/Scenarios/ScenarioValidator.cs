using System.Globalization;

namespace LaunchLogger.Simulation.Scenarios;

/// <summary>Range checks for every scenario parameter, reported by JSON path.</summary>
internal static class ScenarioValidator
{
    internal static string? Validate(Scenario s)
    {
        var c = new Checker();
        VehicleSpec v = s.Vehicle;
        c.Positive("vehicle.mass_kg", v.MassKg);
        c.Range("vehicle.wheelbase_m", v.WheelbaseM, 0.5, 10);
        c.Range("vehicle.cg_height_m", v.CgHeightM, 0.05, 3);
        c.Range("vehicle.front_weight_fraction", v.FrontWeightFraction, 0.05, 0.95);
        c.Range("vehicle.front_torque_fraction", v.FrontTorqueFraction, 0, 1);
        c.Range("vehicle.drag_area_m2", v.DragAreaM2, 0, 20);
        c.Range("vehicle.rolling_resistance_coefficient", v.RollingResistanceCoefficient, 0, 0.5);
        c.Range("vehicle.axle_inertia_kg_m2", v.AxleInertiaKgM2, 1e-4, 100);
        c.Positive("vehicle.pitch_stiffness_nm_per_rad", v.PitchStiffnessNmPerRad);
        c.Range("vehicle.pitch_frequency_hz", v.PitchFrequencyHz, 0.2, 20);
        c.Range("vehicle.pitch_damping_ratio", v.PitchDampingRatio, 0, 5);

        TyreSpec t = s.Tyre;
        c.Range("tyre.rolling_radius_m", t.RollingRadiusM, 0.05, 2);
        c.Range("tyre.radius_growth_at_30_mps", t.RadiusGrowthAt30Mps, 0, 0.1);
        c.Range("tyre.peak_friction", t.PeakFriction, 0.05, 5);
        c.Range("tyre.peak_slip", t.PeakSlip, 0.01, 0.5);
        c.Range("tyre.sliding_friction_fraction", t.SlidingFrictionFraction, 0.5, 1);

        DrivetrainSpec d = s.Drivetrain;
        c.Range("drivetrain.efficiency", d.Efficiency, 0.1, 1);
        if (d.Kind == DrivetrainKind.Engine)
        {
            EngineSpec e = d.Engine;
            c.NotNull("drivetrain.engine.torque_curve", e.TorqueCurve);
            if (e.TorqueCurve is { } curve)
            {
                if (curve.Count < 2)
                {
                    c.Fail("drivetrain.engine.torque_curve", "needs at least 2 points", curve.Count);
                }

                for (int i = 0; i < curve.Count; i++)
                {
                    string at = $"drivetrain.engine.torque_curve[{i}]";
                    if (curve[i] is null)
                    {
                        c.Fail(at, "must be an object with rpm and torque_nm", "null");
                        continue;
                    }

                    c.Range(at + ".torque_nm", curve[i].TorqueNm, 0, 20000);
                    if (i > 0 && curve[i - 1] is { } prev && !(curve[i].Rpm > prev.Rpm))
                    {
                        c.Fail(at + ".rpm", "must be above the previous point's rpm", curve[i].Rpm);
                    }
                }
            }

            c.Range("drivetrain.engine.idle_rpm", e.IdleRpm, 100, 5000);
            c.Range("drivetrain.engine.launch_rpm", e.LaunchRpm, e.IdleRpm, e.RedlineRpm);
            c.Range("drivetrain.engine.redline_rpm", e.RedlineRpm, 1000, 30000);
            c.Range("drivetrain.engine.shift_rpm", e.ShiftRpm, e.IdleRpm, e.RedlineRpm);
            c.Range("drivetrain.engine.inertia_kg_m2", e.InertiaKgM2, 1e-4, 10);
            c.NotNull("drivetrain.engine.gear_ratios", e.GearRatios);
            if (e.GearRatios is { } gears)
            {
                if (gears.Count == 0)
                {
                    c.Fail("drivetrain.engine.gear_ratios", "needs at least one gear", 0);
                }

                for (int i = 0; i < gears.Count; i++)
                {
                    c.Range($"drivetrain.engine.gear_ratios[{i}]", gears[i], 0.1, 20);
                }
            }

            c.Range("drivetrain.engine.final_drive", e.FinalDrive, 0.5, 20);
            c.Range("drivetrain.engine.shift_time_s", e.ShiftTimeS, 0, 5);
            c.Positive("drivetrain.engine.clutch_capacity_nm", e.ClutchCapacityNm);
            c.Range("drivetrain.engine.clutch_engage_s", e.ClutchEngageS, 0, 10);
        }
        else
        {
            MotorSpec m = d.Motor;
            c.Positive("drivetrain.motor.max_torque_nm", m.MaxTorqueNm);
            c.Positive("drivetrain.motor.max_power_w", m.MaxPowerW);
            c.Range("drivetrain.motor.max_rpm", m.MaxRpm, 100, 100000);
            c.Range("drivetrain.motor.gear_ratio", m.GearRatio, 0.1, 50);
            c.Range("drivetrain.motor.inertia_kg_m2", m.InertiaKgM2, 0, 10);
            c.Range("drivetrain.motor.torque_ramp_s", m.TorqueRampS, 0, 10);
            if (m.TractionControlSlip is { } tc)
            {
                c.Range("drivetrain.motor.traction_control_slip", tc, 0.01, 1);
            }
        }

        BrakeSpec b = s.Brakes;
        c.Range("brakes.rise_time_s", b.RiseTimeS, 0, 5);
        c.Range("brakes.front_bias", b.FrontBias, 0, 1);
        c.Range("brakes.abs_release_slip", b.AbsReleaseSlip, 0.01, 1);
        c.Range("brakes.abs_reapply_slip", b.AbsReapplySlip, 0, b.AbsReleaseSlip);
        c.Positive("brakes.abs_dump_rate_per_s", b.AbsDumpRatePerS);
        c.Positive("brakes.abs_apply_rate_per_s", b.AbsApplyRatePerS);
        c.Range("brakes.abs_min_speed_mps", b.AbsMinSpeedMps, 0, 20);

        EnvironmentSpec env = s.Environment;
        c.Range("environment.grade_percent", env.GradePercent, -30, 30);
        c.Range("environment.headwind_mps", env.HeadwindMps, -40, 40);
        c.Range("environment.air_density_kg_m3", env.AirDensityKgM3, 0, 2);

        RunPlan p = s.Plan;
        c.Range("plan.stage_s", p.StageS, 0, 600);
        if (p.MarkHeldAroundLaunchS is { } mark)
        {
            c.Range("plan.mark_held_around_launch_s", mark, 0.001, 60);
        }
        if (p.TargetSpeedMps is null && p.TargetDistanceM is null)
        {
            c.Fail("plan.target_speed_mps", "or plan.target_distance_m must be set", "null");
        }

        if (p.TargetSpeedMps is { } ts)
        {
            c.Range("plan.target_speed_mps", ts, 0.1, 150);
        }

        if (p.TargetDistanceM is { } td)
        {
            c.Range("plan.target_distance_m", td, 0.01, 100000);
        }

        c.Range("plan.coast_s", p.CoastS, 0, 600);
        c.Range("plan.brake_demand_g", p.BrakeDemandG, 0.05, 3);
        c.Range("plan.stand_still_after_s", p.StandStillAfterS, 0, 600);
        c.Range("plan.max_duration_s", p.MaxDurationS, 1, 3600);

        Pickup(c, "pickup", s.Pickup);
        if (s.SecondPickup is { } second)
        {
            Pickup(c, "second_pickup", second);
        }

        CaptureSpec cap = s.Capture;
        c.Range("capture.loop_period_micros", cap.LoopPeriodMicros, 10, 100000);
        c.Range("capture.loop_jitter_micros", cap.LoopJitterMicros, 0, cap.LoopPeriodMicros);
        c.Range("capture.pauses_per_second", cap.PausesPerSecond, 0, 100);
        c.Range("capture.pause_micros", cap.PauseMicros, 0, 1_000_000);
        c.Range("capture.edge_latency_micros", cap.EdgeLatencyMicros, 0, 100000);
        c.Range("capture.edge_jitter_micros", cap.EdgeJitterMicros, 0, 100000);
        c.Range("capture.queue_capacity", cap.QueueCapacity, 1, 1_000_000);

        AccelerometerSpec a = s.Accelerometer;
        if (a.Present)
        {
            c.Range("accelerometer.output_data_rate_hz", a.OutputDataRateHz, 1, 10000);
            c.Range("accelerometer.clock_drift_ppm", a.ClockDriftPpm, -100000, 100000);
            c.Range("accelerometer.fifo_depth", a.FifoDepth, 1, 4096);
            c.Range("accelerometer.read_interval_micros", a.ReadIntervalMicros, 100, 1_000_000);
            c.Range("accelerometer.noise_density_micro_g_per_root_hz", a.NoiseDensityMicroGPerRootHz, 0, 100000);
            c.Range("accelerometer.vibration_milli_g_rms", a.VibrationMilliGRms, 0, 1000);
            c.NotNull("accelerometer.bias_milli_g", a.BiasMilliG);
            c.NotNull("accelerometer.scale_error", a.ScaleError);
            c.Range("accelerometer.mount_pitch_deg", a.MountPitchDeg, -90, 90);
            c.Range("accelerometer.mount_roll_deg", a.MountRollDeg, -90, 90);
            c.Range("accelerometer.mount_yaw_deg", a.MountYawDeg, -180, 180);
            c.Range("accelerometer.full_scale_g", a.FullScaleG, 1, 32);
            c.Range("box.pre_trigger_s", s.Box.PreTriggerS, 0.05, 30);
        }

        c.Range("brake_switch.delay_s", s.BrakeSwitch.DelayS, 0, 2);

        BoxSpec box = s.Box;
        c.Range("box.clock_start_micros", box.ClockStartMicros, 0, uint.MaxValue);
        c.Range("box.counter_start", box.CounterStart, 0, long.MaxValue / 4);
        if (box.ConfiguredCircumferenceM is { } circ)
        {
            c.Range("box.configured_circumference_m", circ, 0.1, 10);
        }

        c.Range("box.rollout_m", box.RolloutM, 0, 10);
        c.Range("box.stage_hold_s", box.StageHoldS, 0.001, 60);
        c.Range("box.stop_hold_s", box.StopHoldS, 0.01, 60);
        c.Range("box.still_band_milli_g", box.StillBandMilliG, 1, 2000);
        c.Range("box.still_block_s", box.StillBlockS, 0.001, 0.5);
        c.Range("box.motion_threshold_milli_g", box.MotionThresholdMilliG, 1, 4000);
        c.Range("box.motion_confirm_samples", box.MotionConfirmSamples, 1, 1000);
        c.Range("box.bracket_limit_micros", box.BracketLimitMicros, 1, 1_000_000);
        return c.Error;
    }

    private static void Pickup(Checker c, string at, PulsePickupSpec pickup)
    {
        c.Range(at + ".teeth", pickup.Teeth, 1, 5000);
        c.Range(at + ".edges_per_tooth", pickup.EdgesPerTooth, 1, 2);
        c.Range(at + ".tooth_spacing_error_fraction", pickup.ToothSpacingErrorFraction, 0, 0.2);
        c.Range(at + ".duty_cycle", pickup.DutyCycle, 0.05, 0.95);
    }

    /// <summary>Keeps the first failure only: one line is the whole report.</summary>
    private sealed class Checker
    {
        public string? Error { get; private set; }

        public void Range(string field, double value, double min, double max)
        {
            if (!(value >= min && value <= max))
            {
                Fail(field, $"must be from {F(min)} to {F(max)}", value);
            }
        }

        public void Positive(string field, double value)
        {
            if (!(value > 0) || double.IsInfinity(value))
            {
                Fail(field, "must be a positive number", value);
            }
        }

        public void NotNull(string field, object? value)
        {
            if (value is null)
            {
                Fail(field, "must be given", "null");
            }
        }

        public void Fail(string field, string rule, object value)
        {
            Error ??= $"field '{field}' {rule} (was {(value is double d ? F(d) : Convert.ToString(value, CultureInfo.InvariantCulture))})";
        }

        private static string F(double v) => v.ToString("0.######", CultureInfo.InvariantCulture);
    }
}
