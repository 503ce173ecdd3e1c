// The invented demo scenario.
export { demoScenario, demoRating, demoFlow, demoLoggerRecord, DEMO_SITE_ID, type DemoScenario, type DemoItem } from './scenario';
