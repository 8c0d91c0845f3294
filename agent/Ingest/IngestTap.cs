using MQTTnet;

namespace LoopWatch.Agent.Ingest;

/// <summary>Told of every MQTT message after the loop state has taken it; the bench counts and times messages through it.</summary>
public delegate void IngestTap(MqttApplicationMessage message, RejectReason reason);
