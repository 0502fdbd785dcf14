using System;
using System.Device.Gpio;
using System.Device.I2c;
using System.Diagnostics;
using System.Threading;
using LaunchLogger.Esp32.Glue;
using LaunchLogger.Firmware;
using LaunchLogger.Firmware.Accelerometers.Lis3dh;
using LaunchLogger.Firmware.Capture;
using LaunchLogger.Firmware.Clock;
using LaunchLogger.Firmware.Hardware;
using LaunchLogger.Firmware.Run;
using LaunchLogger.Firmware.Sinks;
using nanoFramework.Hardware.Esp32;
using nanoFramework.System.IO.FileSystem;

namespace LaunchLogger.Esp32
{
    /// <summary>Wires the ESP32's hardware to the firmware core and runs the capture loop for
    /// as long as the box has power. Closed courses only.</summary>
    public static class Program
    {
        /// <summary>Entry point.</summary>
        public static void Main()
        {
            Configuration.SetPinFunction(PinMap.I2cData, DeviceFunction.I2C1_DATA);
            Configuration.SetPinFunction(PinMap.I2cClock, DeviceFunction.I2C1_CLOCK);
            Configuration.SetPinFunction(PinMap.SdMosi, DeviceFunction.SPI1_MOSI);
            Configuration.SetPinFunction(PinMap.SdMiso, DeviceFunction.SPI1_MISO);
            Configuration.SetPinFunction(PinMap.SdClock, DeviceFunction.SPI1_CLOCK);
            Configuration.SetPinFunction(PinMap.SerialTx, DeviceFunction.COM2_TX);
            Configuration.SetPinFunction(PinMap.SerialRx, DeviceFunction.COM2_RX);

            GpioController gpio = new GpioController();
            StatusLed led = new StatusLed(gpio, PinMap.StatusLed);
            HealthCounters health = new HealthCounters();
            MonotonicClock clock = new MonotonicClock(new Esp32MicrosecondCounter(), health);

            // The counters read 0 until started: the recorder takes 0 as their origin, so the
            // first edge after start-up already counts.
            Esp32PulseCounter counter = new Esp32PulseCounter(PinMap.WheelPulse, PinMap.SecondWheelPulse);
            PolledPulseSource polled = new PolledPulseSource(counter, clock);
            IPulseSource pulses = new PollOnEachStep(polled);

            IAccelerometer accelerometer = OpenAccelerometer();
            IByteSink sink = OpenSinks(led);
            RunRecorder recorder;
            try
            {
                recorder = new RunRecorder(BoxSettings.Create(accelerometer), sink, health);
            }
            catch (ArgumentException e)
            {
                // A setting out of range (BoxSettings.cs): say which on the debug output and blink
                // the fault pattern until the box is set up again and redeployed.
                Debug.WriteLine("settings: " + e.Message);
                led.ShowFault(int.MaxValue);
                Thread.Sleep(Timeout.Infinite);
                return;
            }

            for (int c = 0; c < counter.ChannelCount; c++)
            {
                recorder.SetCounterOrigin(c, 0);
            }

            IDigitalInput brake = new PolledInput(gpio, PinMap.BrakeSwitch, true);
            IDigitalInput mark = new PolledInput(gpio, PinMap.MarkButton, true);
            CaptureLoop loop = new CaptureLoop(
                clock,
                pulses,
                accelerometer,
                brake,
                mark,
                led,
                recorder,
                Lis3dhFifoReader.FifoDepth,
                StepBudget.AccelIntervalMicros);

            // Switch levels count after holding 20 ms (contact bounce), dated to the pass that
            // first saw them.
            loop.SwitchHoldMicros = 20000;

            // Bounded work per pass (hardware-notes/esp32-and-linux-boards.md): a few samples per
            // read, small pulse frames, the pre-trigger samples written a share at a time.
            StepBudget.Apply(loop);

            counter.Start();
            Debug.WriteLine("LaunchLogger running");

            // Every pass polls the pulse counter once (inside Step, via PollOnEachStep): the
            // faster the loop, the narrower the brackets. No sleep, no allocation in here.
            while (true)
            {
                loop.Step();
            }
        }

        private static IAccelerometer OpenAccelerometer()
        {
            try
            {
                I2cDevice device = I2cDevice.Create(new I2cConnectionSettings(1, BoxSettings.AccelI2cAddress, I2cBusSpeed.FastMode));

                // 400 Hz: the interpreted runtime reads each sample with its own I2C transfer, and
                // 1344 Hz would leave too little time for polling the pulse counter.
                return Lis3dhFifoReader.Open(new I2cRegisterBus(device), 400, BoxSettings.AccelRangeG);
            }
            catch (Exception e)
            {
                // Pulses alone still give a run; the configuration frame says no accelerometer.
                Debug.WriteLine("no accelerometer: " + e.Message);
                return null;
            }
        }

        private static IByteSink OpenSinks(StatusLed led)
        {
            IByteSink file = null;
            try
            {
                SDCardSpiParameters spi = new SDCardSpiParameters();
                spi.spiBus = 1;
                // chipSelectPin is a uint: convert explicitly (an int constant converts silently only
                // because it is a constant; a pin read from settings would not compile).
                spi.chipSelectPin = (uint)PinMap.SdChipSelect;
                SDCard card = new SDCard(spi);
                card.Mount();
                file = new FileSink("D:\\", BoxSettings.FlushIntervalMs);
            }
            catch (Exception e)
            {
                Debug.WriteLine("no SD card (" + e.Message + "); logging to internal flash I:\\");
                try
                {
                    file = new FileSink("I:\\", BoxSettings.FlushIntervalMs);
                }
                catch (Exception e2)
                {
                    Debug.WriteLine("no internal storage either: " + e2.Message);
                }
            }

            SerialSink serial = null;
            try
            {
                serial = new SerialSink("COM2", BoxSettings.SerialBaudRate, 8192, 50);
            }
            catch (Exception e)
            {
                Debug.WriteLine("no serial stream: " + e.Message);
            }

            if (file == null)
            {
                led.ShowFault(5000);
                Thread.Sleep(5000);
            }

            if (file != null && serial != null)
            {
                return new TeeByteSink(file, serial);
            }

            if (file != null)
            {
                return file;
            }

            if (serial != null)
            {
                return serial;
            }

            return new NullSink();
        }

        /// <summary>Takes nothing: with no storage and no stream the LED still shows the phases.</summary>
        private sealed class NullSink : IByteSink
        {
            public bool Write(byte[] buffer, int offset, int count)
            {
                return false;
            }
        }
    }
}
