namespace LaunchLogger.Firmware.Accelerometers.Lis3dh
{
    /// <summary>The LIS3DH registers the FIFO driver touches (register map: ST LIS3DH datasheet,
    /// section 7; from memory).</summary>
    public enum Lis3dhRegister : byte
    {
        /// <summary>Identity register; reads 0x33.</summary>
        WhoAmI = 0x0F,

        /// <summary>Output data rate (bits 7:4), low-power bit, Z Y X enables (bits 2:0).</summary>
        CtrlReg1 = 0x20,

        /// <summary>Block data update, full scale (bits 5:4), high-resolution bit (bit 3).</summary>
        CtrlReg4 = 0x23,

        /// <summary>Bit 6 FIFO_EN.</summary>
        CtrlReg5 = 0x24,

        /// <summary>First of six output registers: X, Y, Z, each low byte then high byte. With the
        /// FIFO on, reading them takes the oldest stored sample.</summary>
        OutXLow = 0x28,

        /// <summary>FIFO mode (bits 7:6: 00 bypass, 10 stream) and watermark.</summary>
        FifoCtrlReg = 0x2E,

        /// <summary>FIFO status: bit 7 watermark, bit 6 overrun (full: the next sample overwrites the
        /// oldest), bit 5 empty, bits 4:0 stored samples.</summary>
        FifoSrcReg = 0x2F,

        /// <summary>Set on a register address to make a multi-byte I2C access step through registers.</summary>
        AutoIncrement = 0x80,
    }
}
