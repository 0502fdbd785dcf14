namespace LaunchLogger.Firmware.Run
{
    /// <summary>Where the run state machine stands; what a status LED or buzzer shows.</summary>
    public enum RunPhase
    {
        /// <summary>Waiting for the car to be still.</summary>
        Idle = 0,

        /// <summary>Still long enough: ready for a launch.</summary>
        Staged = 1,

        /// <summary>A run is open; the rollout distance is not yet covered.</summary>
        Moving = 2,

        /// <summary>A run is open and the rollout mark has passed.</summary>
        RolledOut = 3,

        /// <summary>The last run closed with a stop; behaves as <see cref="Idle"/>.</summary>
        Stopped = 4,

        /// <summary>A bench rest: armed by the mark button held while staged, recording the
        /// accelerometer from the button's release for the set time; then <see cref="Idle"/>.</summary>
        BenchRest = 5,
    }
}
