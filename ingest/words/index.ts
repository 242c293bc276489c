/** The words shown to people, the same in the app and in e-mail. */
export * from './advice';
export * from './alarms';
export * from './dewPoint';
export * from './format';
export * from './history';
export * from './sensors';
export * from './zones';
export * from './levels';
export * from './rules';
export * from './paper';
export * from './report';
export * from './weekMail';
export * from './trials';
export * from './care';
export * from './importReasons';
export * from './imports';
export * from './mqtt';
