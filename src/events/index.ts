export { recordEvent, eventsFor, type TEventFields } from "./record";
